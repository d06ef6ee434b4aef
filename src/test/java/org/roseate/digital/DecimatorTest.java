package org.roseate.digital;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.roseate.model.Complex;

class DecimatorTest {

    @Test
    void factorOneIsTheIdentity() {
        Decimator d = Decimator.forAudio(1, 48000);
        assertEquals(0, d.stages().size());
        assertEquals(Complex.ONE, d.response(1000));
        double[] x = SosFilterTest.noise(10, 1);
        double[] y = new double[10];
        d.newRuntime().process(x, 0, y, 0, 10);
        assertArrayEquals(x, y, 0.0);
    }

    @ParameterizedTest
    @ValueSource(doubles = {44100, 48000})
    void factorFourProtectsEveryAliasImageOfTheAudioBand(double fs) {
        Decimator d = Decimator.forAudio(4, fs);
        assertEquals(2, d.stages().size());
        assertTrue(d.stages().get(0).halfLength() < d.stages().get(1).halfLength(), "first stage is shorter");
        double worstRipple = 0;
        for (int i = 0; i <= 4000; i++) {
            worstRipple = Math.max(worstRipple, Math.abs(20 * Math.log10(d.response(20000.0 * i / 4000).abs())));
        }
        // two stages of ±0.005 dB each
        assertTrue(worstRipple <= 0.01, "ripple " + worstRipple);
        // input frequencies m·fs ± f0 (f0 in the audio band) fold onto f0: all must be >= 100 dB down
        double worst = 0;
        for (int m = 1; m <= 2; m++) {
            for (int i = 0; i <= 4000; i++) {
                double f0 = 20000.0 * i / 4000;
                worst = Math.max(worst, d.response(m * fs - f0).abs());
                if (m * fs + f0 <= 2 * fs) {
                    worst = Math.max(worst, d.response(m * fs + f0).abs());
                }
            }
        }
        assertTrue(-20 * Math.log10(worst) >= 100, "alias rejection " + -20 * Math.log10(worst) + " dB");
    }

    @Test
    void responseIsTheProductOfTheStagesAndDelayTheirSum() {
        Decimator d = Decimator.forAudio(4, 44100);
        Complex expected = d.stages().get(0).response(5000).times(d.stages().get(1).response(5000));
        assertEquals(expected, d.response(5000));
        double delay = d.stages().get(0).groupDelayOutputSamples() / 2.0 + d.stages().get(1).groupDelayOutputSamples();
        assertEquals(delay, d.groupDelayOutputSamples(), 0.0);
    }

    @ParameterizedTest
    @ValueSource(ints = {2, 4, 8, 16})
    void blocksGiveTheWholeSignalBitwise(int factor) {
        Decimator d = Decimator.forAudio(factor, 48000);
        int nOut = 1501;
        double[] x = SosFilterTest.noise(nOut * factor, 5);
        double[] whole = new double[nOut];
        d.newRuntime().process(x, 0, whole, 0, nOut);
        for (int block : new int[] {1, 3, 64, 700}) {
            Decimator.Runtime r = d.newRuntime();
            double[] out = new double[nOut];
            for (int o = 0; o < nOut; o += block) {
                int c = Math.min(block, nOut - o);
                r.process(x, o * factor, out, o, c);
            }
            assertArrayEquals(whole, out, 0.0, "block " + block);
        }
    }

    @Test
    void rejectsBadArguments() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> Decimator.forAudio(3, 48000));
        assertTrue(e.getMessage().contains("factor=3"), e.getMessage());
        Decimator.Runtime r = Decimator.forAudio(2, 48000).newRuntime();
        assertThrows(IllegalArgumentException.class, () -> r.process(new double[3], 0, new double[2], 0, 2));
    }

    /**
     * The cascade's streaming output equals running each half-band stage over the whole signal in
     * turn (the definition of the cascade), for every factor; this caught a runtime that drove only
     * the first two stages of an 8× or 16× cascade.
     */
    @ParameterizedTest
    @ValueSource(ints = {2, 4, 8, 16})
    void cascadeEqualsStageByStage(int factor) {
        Decimator d = Decimator.forAudio(factor, 44100);
        java.util.Random r = new java.util.Random(17);
        int nOut = 3000;
        double[] x = new double[nOut * factor];
        for (int i = 0; i < x.length; i++) {
            x[i] = r.nextGaussian();
        }
        double[] expected = x;
        for (HalfbandDecimator stage : d.stages()) {
            double[] y = new double[expected.length / 2];
            stage.newRuntime().process(expected, 0, expected.length, y, 0);
            expected = y;
        }
        double[] got = new double[nOut];
        d.newRuntime().process(x, 0, got, 0, nOut);
        org.junit.jupiter.api.Assertions.assertArrayEquals(expected, got, 0.0);
    }
}
