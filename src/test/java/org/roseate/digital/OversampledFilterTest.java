package org.roseate.digital;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.junit.jupiter.api.Test;
import org.roseate.model.Complex;

class OversampledFilterTest {

    private static OversampledFilter path(int factor) {
        return OversampledFilter.design(OversamplingTest.pinkNetwork(), 44100, factor, PrewarpRule.PER_ROOT, 1000);
    }

    @ParameterizedTest
    @ValueSource(ints = {1, 2, 4})
    void runtimeIsSectionsThenDecimatorAndBlocksDoNotMatter(int factor) {
        OversampledFilter p = path(factor);
        assertEquals(factor, p.factor());
        assertEquals(44100.0 * factor, p.sections().sampleRateHz());
        int nOut = 1300;
        double[] x = SosFilterTest.noise(nOut * factor, 9);
        // by hand: the same sections and decimator, applied one after the other to the whole signal
        double[] mid = x.clone();
        new SosFilter(p.sections()).process(mid, mid, mid.length);
        double[] expected = new double[nOut];
        p.decimator().newRuntime().process(mid, 0, expected, 0, nOut);
        double[] whole = new double[nOut];
        p.newRuntime().process(x, whole, nOut);
        assertArrayEquals(expected, whole, 0.0);
        for (int block : new int[] {1, 3, 64}) {
            OversampledFilter.Runtime r = p.newRuntime();
            double[] out = new double[nOut];
            double[] in = new double[block * factor];
            double[] o = new double[block];
            for (int pos = 0; pos < nOut; pos += block) {
                int c = Math.min(block, nOut - pos);
                System.arraycopy(x, pos * factor, in, 0, c * factor);
                r.process(in, o, c);
                System.arraycopy(o, 0, out, pos, c);
            }
            assertArrayEquals(whole, out, 0.0, "block " + block);
        }
    }

    @Test
    void responseIsSectionsTimesDecimator() {
        OversampledFilter p = path(4);
        Complex expected = p.sections().response(3000).times(p.decimator().response(3000));
        assertEquals(expected, p.response(3000));
        assertEquals(20 * Math.log10(expected.abs()), p.responseDb(3000), 1e-12);
        // gain matched at 1 kHz to the analog model, the decimator adds at most its 0.01 dB ripple
        double analogDb = 20 * Math.log10(OversamplingTest.pinkNetwork().evaluateAtHz(1000).abs());
        assertEquals(analogDb, p.responseDb(1000), 0.01);
    }

    @Test
    void steadySineAtTheOutputFollowsTheResponse() {
        OversampledFilter p = path(2);
        double hz = 5000;
        int nOut = 30000;
        double fsIn = 88200;
        double[] x = new double[2 * nOut];
        for (int i = 0; i < x.length; i++) {
            x[i] = Math.sin(2 * Math.PI * hz * i / fsIn);
        }
        double[] y = new double[nOut];
        p.newRuntime().process(x, y, nOut);
        Complex h = p.response(hz);
        for (int m = nOut - 100; m < nOut; m++) {
            double w = 2 * Math.PI * hz * m / 44100;
            // output sample m is input sample 2m: the phase of the full path is in response(hz)
            assertEquals(h.re() * Math.sin(w) + h.im() * Math.cos(w), y[m], 1e-9, "sample " + m);
        }
    }

    @Test
    void rejectsShortBuffers() {
        OversampledFilter.Runtime r = path(2).newRuntime();
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> r.process(new double[5], new double[3], 3));
        assertEquals("nOut=3 needs 6 input and 3 output samples; have 5, 3", e.getMessage());
        assertThrows(IllegalArgumentException.class,
                () -> OversampledFilter.design(OversamplingTest.pinkNetwork(), 44100, 32, PrewarpRule.PER_ROOT, 1000));
    }
}
