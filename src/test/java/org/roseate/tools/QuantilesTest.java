package org.roseate.tools;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import org.junit.jupiter.api.Test;

class QuantilesTest {
    @Test
    void linearInterpolationAsNumpy() {
        double[] s = {10, 1, 9, 2, 8, 3, 7, 4, 6, 5};
        Quantiles q = Quantiles.of(s);
        // reference: numpy.percentile(range(1, 11), [5, 50, 95]) (method "linear") = 1.45, 5.5, 9.55;
        // by hand: rank p·(n−1) = 0.45, 4.5, 8.55 between the sorted values 1 … 10.
        assertEquals(1.45, q.p5(), 1e-12);
        assertEquals(5.5, q.p50(), 1e-12);
        assertEquals(9.55, q.p95(), 1e-12);
        assertEquals(10, s[0], "the input is not sorted in place");
    }

    @Test
    void orderStatisticErrorOfAUniformMedian() {
        int n = 10_000;
        double[] s = new double[n];
        for (int i = 0; i < n; i++) {
            s[i] = (i + 0.5) / n;
        }
        // reference: for a uniform density of 1 on [0, 1] the median's standard error is √(p(1−p)/n)/f
        // = 0.5/√n = 0.005 (asymptotic order-statistic variance, closed form); ±1 rank of rounding.
        assertEquals(0.005, Quantiles.standardError(s, 0.5), 2.0 / n);
        assertThrows(IllegalArgumentException.class, () -> Quantiles.of(new double[0]));
        assertThrows(IllegalArgumentException.class, () -> Quantiles.percentile(s, 1.5));
    }
}
