package org.roseate.noise;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;

import org.junit.jupiter.api.Test;

class SoftLimiterTest {

    private final SoftLimiter limiter = new SoftLimiter();
    private final double knee = Math.pow(10, -1.0 / 20); // −1 dBFS as amplitude, definition of dBFS peak
    private final double headroom = 1 - knee;

    @Test
    void defaultKneeIsMinusOneDbfs() {
        assertEquals(-1.0, limiter.kneeDbfs());
        assertEquals(knee, limiter.kneeAmplitude(), 1e-15);
    }

    @Test
    void identityAtAndBelowTheKnee() {
        double[] x = new double[100_000];
        new WhiteNoiseSource(31L, WhiteNoiseSource.Distribution.UNIFORM).fill(x, 0, x.length);
        for (double v : x) {
            double u = v / Math.sqrt(3) * limiter.kneeAmplitude();
            assertEquals(u, limiter.apply(u), 0.0);
        }
        assertEquals(limiter.kneeAmplitude(), limiter.apply(limiter.kneeAmplitude()), 0.0);
        assertEquals(-limiter.kneeAmplitude(), limiter.apply(-limiter.kneeAmplitude()), 0.0);
        assertEquals(0.0, limiter.apply(0.0), 0.0);
    }

    @Test
    void valueAndSlopeAreContinuousAtTheKnee() {
        double t = limiter.kneeAmplitude();
        double h = 1e-6;
        // value: y(T + h) − T = H·tanh(h/H) = h − h³/(3H²) + … (closed form)
        assertEquals(h, limiter.apply(t + h) - t, 1e-15);
        // right-hand slope → 1 = the identity's slope; difference quotient rounding ~ulp(T)/h = 1e-10
        double right = (limiter.apply(t + h) - limiter.apply(t)) / h;
        assertEquals(1.0, right, 1e-8);
        // away from the knee the slope is sech²((|x| − T)/H) (closed form of tanh')
        double x = t + 0.05;
        double d = 1e-7;
        double slope = (limiter.apply(x + d) - limiter.apply(x - d)) / (2 * d);
        double v = (x - t) / headroom;
        double sech = 1 / Math.cosh(v);
        assertEquals(sech * sech, slope, 1e-7); // central difference O(d²) plus rounding ulp/d ≈ 1e-9
    }

    @Test
    void followsTheTanhShoulder() {
        double t = limiter.kneeAmplitude();
        // tanh(atanh(½)) = ½: y = T + H/2 at x = T + H·atanh(½), atanh(½) = ½·ln 3 (closed form)
        double x = t + headroom * 0.5 * Math.log(3);
        assertEquals(t + 0.5 * headroom, limiter.apply(x), 1e-15);
    }

    @Test
    void neverReachesFullScale() {
        double[] big = {1.0, 1.5, 2.0, 10.0, 1e3, 1e300, Double.MAX_VALUE, Double.POSITIVE_INFINITY};
        for (double x : big) {
            assertTrue(limiter.apply(x) < 1.0, "x=" + x);
            assertTrue(limiter.apply(-x) > -1.0, "x=-" + x);
        }
        assertTrue(Double.isNaN(limiter.apply(Double.NaN)));
    }

    @Test
    void oddAndMonotone() {
        double prev = Double.NEGATIVE_INFINITY;
        for (int i = -300_000; i <= 300_000; i++) {
            double x = i * 1e-5;
            double y = limiter.apply(x);
            if (limiter.apply(-x) != -y || y < prev) {
                fail("not odd or not monotone at x=" + x);
            }
            prev = y;
        }
    }

    @Test
    void processEqualsApplyForAnyBlock() {
        double[] x = new double[1001];
        new WhiteNoiseSource(32L).fill(x, 0, x.length);
        double[] expected = new double[x.length];
        for (int i = 0; i < x.length; i++) {
            x[i] *= 0.5; // some samples beyond the knee (1.8 σ)
            expected[i] = limiter.apply(x[i]);
        }
        for (int block : new int[] {1, 3, 64, x.length}) {
            double[] buf = x.clone();
            for (int off = 0; off < buf.length; off += block) {
                limiter.process(buf, off, Math.min(block, buf.length - off));
            }
            limiter.process(buf, 0, 0);
            assertArrayEquals(expected, buf, "block " + block);
        }
    }

    @Test
    void rejectsBadKnees() {
        assertTrue(assertThrows(IllegalArgumentException.class, () -> new SoftLimiter(0.0))
                .getMessage().contains("kneeDbfs=0.0"));
        assertThrows(IllegalArgumentException.class, () -> new SoftLimiter(-61));
        assertThrows(IllegalArgumentException.class, () -> new SoftLimiter(Double.NaN));
        assertThrows(IndexOutOfBoundsException.class, () -> limiter.process(new double[2], 1, 2));
    }
}
