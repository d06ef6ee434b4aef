package org.roseate.digital;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.roseate.model.Complex;

class HalfbandDecimatorTest {
    // reference: numpy.kaiser / numpy.sinc taps, scipy.signal.upfirdn(h, x, down=2) and scipy.signal.freqz,
    // scipy 1.17.1, numpy 2.4.6, see src/test/python/gen_digital_reference.py
    private static final JsonNode REF = Reference.load("halfband.json");

    private static HalfbandDecimator referenceDesign() {
        return HalfbandDecimator.kaiser(REF.get("inputRateHz").asDouble(), REF.get("halfLength").asInt(),
                REF.get("beta").asDouble());
    }

    @Test
    void tapsEqualTheNumpyConstruction() {
        double[] expected = Reference.doubles(REF.get("taps"));
        // tolerance: Bessel series vs numpy's Chebyshev I0 and sin vs sinc differ by a few ulp
        assertArrayEquals(expected, referenceDesign().taps(), 1e-15);
        double[] h = referenceDesign().taps();
        assertEquals(0.0, h[0], 0.0, "end taps are exact zeros");
        assertEquals(0.0, h[2], 0.0, "even offsets from the centre are exact zeros");
        assertEquals(0.5, h[h.length / 2], 0.0, "centre tap");
    }

    @Test
    void streamingOutputEqualsUpfirdn() {
        double[] x = Reference.doubles(REF.get("input"));
        double[] expected = Reference.doubles(REF.get("output"));
        double[] y = new double[expected.length];
        int n = referenceDesign().newRuntime().process(x, 0, x.length, y, 0);
        assertEquals(expected.length, n, "1001 inputs give 501 outputs from an even start");
        // 77 products of O(1) values summed in another order: 1e-14 absolute
        assertArrayEquals(expected, y, 1e-14);
    }

    @Test
    void responseEqualsScipyFreqz() {
        HalfbandDecimator d = referenceDesign();
        double[] hz = Reference.doubles(REF.get("freqHz"));
        double[] re = Reference.doubles(REF.get("hRe"));
        double[] im = Reference.doubles(REF.get("hIm"));
        for (int i = 0; i < hz.length; i++) {
            Complex h = d.response(hz[i]);
            // cosine-sum vs direct exponential sum: rounding of ~150 terms, 1e-13 absolute
            assertEquals(re[i], h.re(), 1e-13, "re at " + hz[i]);
            assertEquals(im[i], h.im(), 1e-13, "im at " + hz[i]);
        }
    }

    @Test
    void anyBlockSizesEvenOrOddGiveTheWholeSignalBitwise() {
        HalfbandDecimator d = referenceDesign();
        double[] x = Reference.doubles(REF.get("input"));
        double[] whole = new double[(x.length + 1) / 2];
        d.newRuntime().process(x, 0, x.length, whole, 0);
        for (int block : new int[] {1, 3, 7, 64}) {
            HalfbandDecimator.Runtime r = d.newRuntime();
            double[] out = new double[whole.length];
            int o = 0;
            for (int off = 0; off < x.length; off += block) {
                o += r.process(x, off, Math.min(block, x.length - off), out, o);
            }
            assertEquals(whole.length, o);
            assertArrayEquals(whole, out, 0.0, "block " + block);
        }
        HalfbandDecimator.Runtime r = d.newRuntime();
        assertEquals(0, r.process(x, 0, 0, whole, 0), "empty block");
        r.process(x, 0, 5, new double[3], 0);
        r.reset();
        double[] again = new double[whole.length];
        r.process(x, 0, x.length, again, 0);
        assertArrayEquals(whole, again, 0.0, "reset clears history and phase");
    }

    @Test
    void impulsePeaksAfterTheDocumentedDelay() {
        HalfbandDecimator d = referenceDesign();
        double[] x = new double[400];
        x[0] = 1;
        double[] y = new double[200];
        d.newRuntime().process(x, 0, x.length, y, 0);
        int peak = 0;
        for (int i = 1; i < y.length; i++) {
            if (Math.abs(y[i]) > Math.abs(y[peak])) {
                peak = i;
            }
        }
        assertEquals(d.groupDelayOutputSamples(), peak);
        assertEquals(0.5, y[peak], 0.0, "the centre tap");
    }

    @ParameterizedTest
    @ValueSource(doubles = {44100, 48000})
    void designMeetsTheAudioSpecificationOnADenseGrid(double outputRateHz) {
        HalfbandDecimator d = HalfbandDecimator.design(2 * outputRateHz, 20000, 100, 0.005);
        double worstRipple = 0;
        for (int i = 0; i <= 20000; i++) {
            double db = 20 * Math.log10(d.response(20000.0 * i / 20000).abs());
            worstRipple = Math.max(worstRipple, Math.abs(db));
        }
        double stopLo = outputRateHz - 20000;
        double worstStop = 0;
        for (int i = 0; i <= 20000; i++) {
            double hz = stopLo + (outputRateHz - stopLo) * i / 20000;
            worstStop = Math.max(worstStop, d.response(hz).abs());
        }
        // specification of the brief: ripple within ±0.005 dB over 0–20 kHz, >= 100 dB above fs_out − 20 kHz
        assertTrue(worstRipple <= 0.005, "ripple " + worstRipple + " dB");
        assertTrue(-20 * Math.log10(worstStop) >= 100, "rejection " + -20 * Math.log10(worstStop) + " dB");
    }

    @Test
    void sinesConfirmPassbandAndAliasRejection() {
        double fsIn = 88200;
        HalfbandDecimator d = HalfbandDecimator.design(fsIn, 20000, 100, 0.005);
        for (double hz : new double[] {1000, 19990}) {
            double amp = decimatedSineAmplitude(d, hz, hz);
            // steady-state least-squares fit of an exact sinusoid: agrees with |H| to rounding
            assertEquals(d.response(hz).abs(), amp, 1e-9, "at " + hz);
            assertTrue(Math.abs(20 * Math.log10(amp)) <= 0.005, "passband sine at " + hz + " Hz: " + amp);
        }
        for (double hz : new double[] {24110, 30000, 44000}) {
            double alias = fsIn / 2 - (hz - fsIn / 2);
            double amp = decimatedSineAmplitude(d, hz, alias);
            assertTrue(amp <= 1e-5, "alias of " + hz + " Hz at " + alias + " Hz: " + 20 * Math.log10(amp) + " dB");
        }
    }

    /** Amplitude of the output component at aliasHz (output rate), fitted after the transient. */
    private static double decimatedSineAmplitude(HalfbandDecimator d, double hz, double aliasHz) {
        int nIn = 20000;
        double[] x = new double[nIn];
        for (int i = 0; i < nIn; i++) {
            x[i] = Math.sin(2 * Math.PI * hz * i / d.inputRateHz());
        }
        double[] y = new double[nIn / 2];
        d.newRuntime().process(x, 0, nIn, y, 0);
        // least squares on [cos, sin] at aliasHz over the settled part
        double scc = 0, sss = 0, scs = 0, syc = 0, sys = 0;
        for (int m = d.groupDelayOutputSamples() * 2; m < y.length; m++) {
            double w = 2 * Math.PI * aliasHz * m / d.outputRateHz();
            double c = Math.cos(w);
            double s = Math.sin(w);
            scc += c * c;
            sss += s * s;
            scs += c * s;
            syc += y[m] * c;
            sys += y[m] * s;
        }
        double det = scc * sss - scs * scs;
        double a = (syc * sss - sys * scs) / det;
        double b = (sys * scc - syc * scs) / det;
        return Math.hypot(a, b);
    }

    @Test
    void rejectsBadSpecifications() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> HalfbandDecimator.design(88200, 30000, 100, 0.005));
        assertTrue(e.getMessage().contains("passbandEdgeHz=30000.0"), e.getMessage());
        assertThrows(IllegalArgumentException.class, () -> HalfbandDecimator.kaiser(88200, 0, 5));
        HalfbandDecimator.Runtime r = referenceDesign().newRuntime();
        assertThrows(IllegalArgumentException.class, () -> r.process(new double[4], 0, 4, new double[1], 0));
    }
}
