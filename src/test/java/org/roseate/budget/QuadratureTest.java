package org.roseate.budget;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.junit.jupiter.api.Test;

/** The range quadrature against closed-form integrals. */
class QuadratureTest {

    @Test
    void firstOrderLowPassMatchesTheArctangent() {
        // ∫ 1/(1+(f/fc)²) df = fc·(atan(hi/fc) − atan(lo/fc)) (elementary integral)
        double fc = 1591.5;
        Quadrature q = Quadrature.of(20, 20000);
        double[] v = new double[q.size()];
        for (int i = 0; i < v.length; i++) {
            double x = q.hz()[i] / fc;
            v[i] = 1 / (1 + x * x);
        }
        double exact = fc * (Math.atan(20000 / fc) - Math.atan(20 / fc));
        assertEquals(exact, q.integrate(v), exact * 1e-9);
    }

    @Test
    void secondOrderLowPassWithQ10MatchesPiQf0OverTwo() {
        // ∫0^∞ |H|² df for H = 1/(1 − (f/f0)² + j(f/f0)/Q) is π·Q·f0/2 (standard integral of the
        // second-order system's power response, e.g. noise-bandwidth tables). Over [1e-4 f0, 1e4 f0]
        // the missing low part is f_lo·(1 + O(1e-8)) and the high part f0·1e-12/3: both corrected below.
        double f0 = 1000;
        double qf = 10;
        Quadrature q = Quadrature.of(f0 * 1e-4, f0 * 1e4);
        double[] v = new double[q.size()];
        for (int i = 0; i < v.length; i++) {
            double x = q.hz()[i] / f0;
            double re = 1 - x * x;
            double im = x / qf;
            v[i] = 1 / (re * re + im * im);
        }
        double exact = Math.PI * qf * f0 / 2 - f0 * 1e-4;
        assertEquals(exact, q.integrate(v), exact * 1e-9);
    }
}
