package org.roseate.spectrum;

import static org.junit.jupiter.api.Assertions.assertEquals;

import com.fasterxml.jackson.databind.JsonNode;
import org.junit.jupiter.api.Test;

class CrossSpectrumTest {
    @Test
    void crossDensityAndCoherenceMatchScipy() {
        JsonNode ref = SpectrumReference.welch();
        double fs = ref.get("sampleRateHz").asDouble();
        double[] x = SpectrumReference.doubles(ref.get("x"));
        double[] y = SpectrumReference.doubles(ref.get("y"));
        for (JsonNode c : ref.get("cases")) {
            CrossSpectrumEstimator e = new CrossSpectrumEstimator();
            e.prepare(fs, SpectrumReference.settings(c));
            for (int i = 0; i < x.length; i += 97) {
                e.accept(x, y, i, Math.min(97, x.length - i));
            }
            CrossSpectralDensity d = e.snapshot();
            // reference: scipy.signal.welch / csd / coherence 1.17.1 (Pxy = conj(X)·Y), see gen_spectrum_reference.py
            double[] pxx = SpectrumReference.doubles(c.get("pxx"));
            double[] pyy = SpectrumReference.doubles(c.get("pyy"));
            double[] re = SpectrumReference.doubles(c.get("pxyRe"));
            double[] im = SpectrumReference.doubles(c.get("pxyIm"));
            double[] coh = SpectrumReference.doubles(c.get("coherence"));
            double[] gotCoh = d.coherence();
            for (int k = 1; k < pxx.length; k++) {
                double scale = Math.sqrt(pxx[k] * pyy[k]);
                // 1e-9 of √(Pxx·Pyy): rounding only; a conjugation slip would flip the imaginary part (error ~|Pxy|)
                assertEquals(pxx[k], d.gxx()[k], 1e-9 * pxx[k]);
                assertEquals(pyy[k], d.gyy()[k], 1e-9 * pyy[k]);
                assertEquals(re[k], d.gxyRe()[k], 1e-9 * scale, "re bin " + k);
                assertEquals(im[k], d.gxyIm()[k], 1e-9 * scale, "im bin " + k);
                // 1e-9: γ² is O(1) and computed from the same densities
                assertEquals(coh[k], gotCoh[k], 1e-9, "coherence bin " + k);
            }
        }
    }
}
