package org.roseate.spectrum;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import com.fasterxml.jackson.databind.JsonNode;
import org.junit.jupiter.api.Test;

class WindowTest {
    @Test
    void coefficientsMatchScipyGetWindow() {
        // reference: scipy.signal.get_window(name, n) (periodic) 1.17.1, see gen_spectrum_reference.py
        int checked = 0;
        for (JsonNode w : SpectrumReference.welch().get("windows")) {
            Window window = Window.parse(w.get("name").asText()).orElseThrow();
            double[] expected = SpectrumReference.doubles(w.get("w"));
            double[] got = window.coefficients(w.get("n").asInt());
            assertEquals(expected.length, got.length);
            for (int i = 0; i < got.length; i++) {
                // 1e-12: the same cosine sums, differing only in rounding (values are O(1))
                assertEquals(expected[i], got[i], 1e-12, w.get("name").asText() + " n=" + got.length + " i=" + i);
            }
            checked++;
        }
        assertEquals(12, checked);
    }

    @Test
    void coherentGainAndNoiseBandwidth() {
        // closed forms for periodic windows (Harris, Proc. IEEE 1978, table 1): Hann CG 0.5, ENBW 1.5 bins;
        // rectangular 1 and 1; Blackman-Harris CG a0 = 0.35875, ENBW (Σ a_k²/2 + a0²/2)/a0² = 2.0044.
        assertEquals(0.5, Window.HANN.coherentGain(1024), 1e-12);
        assertEquals(1.5, Window.HANN.enbwBins(1024), 1e-12);
        assertEquals(1.0, Window.RECTANGULAR.coherentGain(100), 1e-15);
        assertEquals(1.0, Window.RECTANGULAR.enbwBins(100), 1e-15);
        double[] a = {0.35875, 0.48829, 0.14128, 0.01168};
        double s = a[0] * a[0];
        for (int k = 1; k < 4; k++) {
            s += a[k] * a[k] / 2;
        }
        assertEquals(0.35875, Window.BLACKMAN_HARRIS.coherentGain(4096), 1e-12);
        assertEquals(s / (a[0] * a[0]), Window.BLACKMAN_HARRIS.enbwBins(4096), 1e-12);
        // flat-top: CG = a0 = 0.21557895 (periodic window, cosines sum to zero)
        assertEquals(0.21557895, Window.FLAT_TOP.coherentGain(4096), 1e-12);
    }

    @Test
    void rejectsEmptyLength() {
        assertThrows(IllegalArgumentException.class, () -> Window.HANN.coefficients(0));
    }
}
