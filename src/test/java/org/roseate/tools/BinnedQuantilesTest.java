package org.roseate.tools;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Arrays;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

class BinnedQuantilesTest {
    /**
     * The exact sample percentile, numpy's default "linear" method written out (numpy.percentile
     * documentation): rank r = p·(n − 1), interpolating between the order statistics either side.
     */
    private static double exact(double[] sorted, double p) {
        double r = p * (sorted.length - 1);
        int k = (int) Math.floor(r);
        return k >= sorted.length - 1 ? sorted[k] : sorted[k] + (r - k) * (sorted[k + 1] - sorted[k]);
    }

    @Test
    void percentilesAreWithinTheStatedErrorOfTheExactOnes() {
        SplittableRandom rnd = new SplittableRandom(42);
        double[] ps = {0, 0.01, 0.05, 0.25, 0.5, 0.75, 0.95, 0.99, 1};
        // Four shapes: a narrow Gaussian (sub-bin spread), a skewed one, a two-point mixture with a
        // gap, and a wide uniform; sample sizes odd and even, small and large.
        for (int n : new int[] {1, 2, 7, 1000, 100_001}) {
            for (int shape = 0; shape < 4; shape++) {
                double[] x = new double[n];
                BinnedQuantiles b = BinnedQuantiles.centredOn(-3);
                for (int i = 0; i < n; i++) {
                    double g = Fitter.gaussian(rnd);
                    x[i] = switch (shape) {
                        case 0 -> -3 + 0.0003 * g;
                        case 1 -> -3 + Math.exp(0.7 * g) - 1;
                        case 2 -> rnd.nextBoolean() ? -10.5 : 4.25 + 0.01 * g;
                        default -> -3 + 60 * (rnd.nextDouble() - 0.5);
                    };
                    b.add(x[i]);
                }
                double[] s = x.clone();
                Arrays.sort(s);
                for (double p : ps) {
                    // the stated bound: half a bin, plus rounding of the bin arithmetic (1e-9 dB)
                    assertEquals(exact(s, p), b.percentile(p), BinnedQuantiles.ERROR_DB + 1e-9,
                            "n=" + n + " shape " + shape + " p=" + p);
                }
                Quantiles q = Quantiles.of(x);
                Quantiles e = b.quantiles();
                assertEquals(q.se5(), e.se5(), 2 * BinnedQuantiles.ERROR_DB + 1e-9);
                assertEquals(q.se50(), e.se50(), 2 * BinnedQuantiles.ERROR_DB + 1e-9);
                assertEquals(q.se95(), e.se95(), 2 * BinnedQuantiles.ERROR_DB + 1e-9);
                assertEquals(s[0], b.min());
                assertEquals(s[n - 1], b.max());
            }
        }
    }

    @Test
    void aPercentileBeyondTheSpanIsRefusedNotGuessed() {
        BinnedQuantiles b = BinnedQuantiles.centredOn(0);
        for (int i = 0; i < 10; i++) {
            b.add(100 + i);
        }
        b.add(0);
        assertTrue(Double.isNaN(b.percentile(0.5)), "the median lies above the 65.5 dB span");
        assertEquals(0, b.percentile(0), BinnedQuantiles.ERROR_DB);
        assertEquals(10, b.outsideSpan());
    }

    @Test
    void mergingEqualsAddingEverythingToOne() {
        SplittableRandom rnd = new SplittableRandom(3);
        BinnedQuantiles all = BinnedQuantiles.centredOn(0);
        BinnedQuantiles a = BinnedQuantiles.centredOn(0);
        BinnedQuantiles c = BinnedQuantiles.centredOn(0);
        for (int i = 0; i < 5000; i++) {
            double v = Fitter.gaussian(rnd);
            all.add(v);
            (i % 3 == 0 ? a : c).add(v);
        }
        a.merge(c);
        assertEquals(all.quantiles(), a.quantiles());
        assertEquals(all.count(), a.count());
    }
}
