package org.roseate.value;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

class ToleranceTest {
    // Percent → fraction is a division by 100 (definition of percent); 1e-15 allows the one
    // rounding of that division.
    @ParameterizedTest
    @CsvSource({
        "1%, 0.01, 1%", "'0.5 %', 0.005, 0.5%", "5%, 0.05, 5%", "10%, 0.1, 10%", "0.1%, 0.001, 0.1%",
        "\u00B1" + "2%, 0.02, 2%", "'  20% ', 0.2, 20%", "0.25%, 0.0025, 0.25%", "7%, 0.07, 7%",
    })
    void parsesPercentages(String text, double fraction, String printed) {
        Tolerance t = Tolerance.parse(text);
        assertEquals(fraction, t.fraction(), 1e-15);
        assertEquals(printed, t.toString());
    }

    @Test
    void percentIsHundredTimesFraction() {
        assertEquals(5.0, new Tolerance(0.05).percent(), 1e-12); // one rounding of ×100
        assertEquals("7%", new Tolerance(0.07).toString()); // 0.07 × 100 = 7.000000000000001 in binary
    }

    @ParameterizedTest
    @CsvSource({
        "0%, 0", "100%, 0", "150%, 0", "1, 1", "%, 0", "abc, 0", "1%%, 2", "-1%, 0", "1.2.3%, 3",
        "'', 0", "' 5 x%', 3",
    })
    void rejectsBadText(String text, int offset) {
        ValueFormatException e = assertThrows(ValueFormatException.class, () -> Tolerance.parse(text));
        assertEquals(offset, e.offset(), e.getMessage());
    }

    @Test
    void constructorChecksRange() {
        for (double bad : new double[] {0, 1, -0.1, 1.5, Double.NaN}) {
            IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> new Tolerance(bad));
            assertEquals("fraction=" + bad + " must be > 0 and < 1", e.getMessage());
        }
    }
}
