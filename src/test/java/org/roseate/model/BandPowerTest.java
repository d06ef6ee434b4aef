package org.roseate.model;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import org.junit.jupiter.api.Test;

class BandPowerTest {

    @Test
    void integratesPinkAndFlatDensitiesExactly() {
        // closed forms: ∫ 1/f df = ln(b/a), ∫ 1 df = b − a; tolerance 1e-12 relative, far below 1e-4 dB (2.3e-5)
        assertEquals(Math.log(10), BandPower.integrate(f -> 1 / f, 100, 1000), 1e-12 * Math.log(10));
        assertEquals(19980, BandPower.integrate(f -> 1, 20, 20000), 1e-12 * 19980);
        assertEquals(10 * Math.log10(19980), BandPower.levelDb(f -> 1, 20, 20000), 1e-12);
    }

    @Test
    void integratesAFirstOrderLowPassAcrossItsCorner() {
        double fc = 1000;
        // closed form: ∫ 1/(1 + (f/fc)²) df = fc·(atan(b/fc) − atan(a/fc))
        for (double[] band : new double[][] {{891, 1122}, {20, 20000}, {5000, 5100}}) {
            double expected = fc * (Math.atan(band[1] / fc) - Math.atan(band[0] / fc));
            double got = BandPower.integrate(f -> 1 / (1 + (f / fc) * (f / fc)), band[0], band[1]);
            assertEquals(expected, got, 1e-12 * expected, band[0] + ".." + band[1]);
        }
    }

    @Test
    void rejectsEmptyOrNegativeBands() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> BandPower.integrate(f -> 1, 100, 100));
        assertEquals("band 100.0-100.0 Hz must satisfy 0 < low < high", e.getMessage());
        assertThrows(IllegalArgumentException.class, () -> BandPower.integrate(f -> 1, 100, Double.POSITIVE_INFINITY));
        assertThrows(IllegalArgumentException.class, () -> BandPower.integrate(f -> 1, -1, 100));
    }
}
