package org.roseate.model;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.List;
import org.junit.jupiter.api.Test;

class PolynomialTest {
    /** Roots of (x+1)(x+2)(x+3)(x²+2x+2.25): closed form −1, −2, −3, −1 ± j·√1.25 (magnitude 1.5). */
    @Test
    void rootsOfAKnownProduct() {
        Polynomial p = new Polynomial(1, 1).times(new Polynomial(2, 1)).times(new Polynomial(3, 1))
                .times(new Polynomial(2.25, 2, 1));
        List<Complex> r = p.roots();
        assertEquals(5, r.size());
        // Sorted by magnitude: −1, then the pair (upper member first), then −2, −3.
        assertEquals(-1, r.get(0).re(), 1e-13);
        assertEquals(-1, r.get(1).re(), 1e-13);
        assertEquals(Math.sqrt(1.25), r.get(1).im(), 1e-13);
        assertEquals(-Math.sqrt(1.25), r.get(2).im(), 1e-13);
        assertEquals(-2, r.get(3).re(), 1e-13);
        assertEquals(-3, r.get(4).re(), 1e-13);
        assertEquals(0, r.get(4).im(), 0);
    }

    /** Widely spread real roots, as an op-amp pole next to audio corners: 1e-3 … 1e3. */
    @Test
    void widelySpreadRoots() {
        Polynomial p = new Polynomial(1);
        double[] roots = {-1e-3, -0.1, -1, -30, -1e3};
        for (double x : roots) {
            p = p.times(new Polynomial(-x, 1));
        }
        List<Complex> r = p.roots();
        for (int i = 0; i < roots.length; i++) {
            // Relative accuracy near 1e-12 expected for simple, well-separated roots.
            assertEquals(roots[i], r.get(i).re(), 1e-10 * Math.abs(roots[i]));
        }
    }

    @Test
    void rootsAtTheOriginAreExact() {
        List<Complex> r = new Polynomial(0, 0, 2, 1).roots();
        assertEquals(Complex.ZERO, r.get(0));
        assertEquals(Complex.ZERO, r.get(1));
        assertEquals(-2, r.get(2).re(), 1e-15);
    }
}
