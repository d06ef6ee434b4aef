package org.roseate.digital;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.SplittableRandom;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/**
 * {@link HalfbandDecimator.Runtime} sums eight outputs side by side through a linear work buffer. These
 * tests hold it bit for bit to the plain definition it documents, one output at a time: output m is
 * h_c·x[2m − 2K] + Σ_j h[2j+1]·(x[2m − 2j − 1] + x[2m − 4K + 2j + 1]), summed in that order, with x = 0
 * before the first input (the direct form of scipy.signal.upfirdn(h, x, down=2); HalfbandDecimatorTest
 * checks the values against upfirdn itself). Tolerance 0: the summation order is the contract.
 */
class HalfbandDecimatorPipelineTest {

    private static double[] plain(HalfbandDecimator d, double[] x) {
        double[] h = d.taps();
        int k = d.halfLength();
        double[] y = new double[(x.length + 1) / 2];
        for (int m = 0; m < y.length; m++) {
            int i = 2 * m;
            double acc = h[2 * k] * at(x, i - 2 * k);
            for (int j = 0; j < k; j++) {
                acc += h[2 * j + 1] * (at(x, i - (2 * j + 1)) + at(x, i - (4 * k - 2 * j - 1)));
            }
            y[m] = acc;
        }
        return y;
    }

    private static double at(double[] x, int i) {
        return i < 0 ? 0 : x[i];
    }

    @ParameterizedTest(name = "K = {0}")
    @ValueSource(ints = {1, 2, 3, 9, 10, 52})
    void equalsOneOutputAtATimeForRandomSplits(int halfLength) {
        SplittableRandom r = new SplittableRandom(4242L + halfLength);
        HalfbandDecimator d = HalfbandDecimator.kaiser(96000, halfLength, 8.0);
        for (int trial = 0; trial < 5; trial++) {
            double[] x = new double[3000 + r.nextInt(3000)];
            for (int i = 0; i < x.length; i++) {
                x[i] = r.nextDouble() * 2 - 1;
            }
            double[] expected = plain(d, x);
            HalfbandDecimator.Runtime rt = d.newRuntime();
            if (trial % 2 == 1) {
                rt.process(new double[7], 0, 7, new double[4], 0);
                rt.reset();
            }
            double[] out = new double[expected.length + 1];
            int pos = 0;
            int written = 0;
            while (pos < x.length) {
                // lengths from 0 to past the 1024-sample work chunk, odd and even
                int n = Math.min(x.length - pos, r.nextInt(4) == 0 ? r.nextInt(2500) : r.nextInt(9));
                int pad = r.nextInt(3);
                double[] in = new double[pad + n];
                System.arraycopy(x, pos, in, pad, n);
                written += rt.process(in, pad, n, out, written);
                pos += n;
            }
            assertEquals(expected.length, written, "one output per two inputs, the first at input 0");
            for (int m = 0; m < expected.length; m++) {
                if (Double.doubleToRawLongBits(expected[m]) != Double.doubleToRawLongBits(out[m])) {
                    throw new AssertionError("K=" + halfLength + " trial " + trial + ": output " + m + " is "
                            + out[m] + ", one output at a time gives " + expected[m]);
                }
            }
        }
    }
}
