package org.roseate.value;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Random;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

class EngineeringValueTest {
    private static final ComponentKind R = ComponentKind.RESISTOR;
    private static final ComponentKind C = ComponentKind.CAPACITOR;
    private static final ComponentKind L = ComponentKind.INDUCTOR;

    /**
     * Expected values are the decimal on the right read by Double.parseDouble; the parser
     * converts with correct rounding too, so the doubles must be identical (no tolerance).
     */
    private static void assertReads(String text, ComponentKind kind, String decimal) {
        assertEquals(Double.parseDouble(decimal), EngineeringValue.parse(text, kind), 0.0, text);
    }

    // Letter-and-digit code examples, IEC 60062 (multiplier letter in place of the decimal
    // point), from memory.
    @ParameterizedTest
    @CsvSource({
        "R47, 0.47", "4R7, 4.7", "100R, 100", "1R, 1", "0R47, 0.47",
        "4k7, 4700", "1k, 1000", "47k, 47000", "4K7, 4700", "k47, 470",
        "2M2, 2.2e6", "1G0, 1e9", "1T, 1e12", "1M, 1e6",
        "3n3, 3.3e-9", "680p, 680e-12", "p68, 0.68e-12", "4u7, 4.7e-6", "2\u00B5" + "2, 2.2e-6",
        "2\u03BC" + "2, 2.2e-6", "1m, 1e-3", "4m7, 4.7e-3",
    })
    void readsLetterCode(String text, String decimal) {
        assertReads(text, R, decimal);
    }

    @Test
    void milliAndMegaAreDistinguishedByCase() {
        // SI prefixes m (1e-3) and M (1e6), BIPM SI Brochure, 9th ed., table 7.
        assertReads("1m", C, "1e-3");
        assertReads("1M", C, "1e6");
    }

    @ParameterizedTest
    @CsvSource({
        "4.7k, 4700", "22n, 22e-9", "0.1u, 0.1e-6", "1.5M, 1.5e6", ".5, 0.5",
        "1000, 1000", "1e-6, 1e-6", "4.7E3, 4700", "0.000001, 1e-6", "1E+3, 1000",
        "'  4k7  ', 4700", "4.7 k, 4700",
    })
    void readsDecimalsAndSiPrefixes(String text, String decimal) {
        assertReads(text, C, decimal);
    }

    @Test
    void readsUnitsOfTheMatchingKind() {
        assertReads("47k\u03A9", R, "47e3");
        assertReads("47k\u2126", R, "47e3"); // OHM SIGN, canonically the same as Greek omega
        assertReads("1.5M\u03A9", R, "1.5e6");
        assertReads("4.7 k\u03A9", R, "4.7e3");
        assertReads("4k7ohm", R, "4.7e3");
        assertReads("100 Ohm", R, "100");
        assertReads("100ohms", R, "100");
        assertReads("1mohm", R, "1e-3");
        assertReads("22nF", C, "22e-9");
        assertReads("2n2F", C, "2.2e-9");
        assertReads("1e-6F", C, "1e-6");
        assertReads("1 F", C, "1");
        assertReads("10mH", L, "10e-3");
        assertReads("4u7H", L, "4.7e-6");
    }

    private static ValueFormatException rejected(String text, ComponentKind kind) {
        return assertThrows(ValueFormatException.class, () -> EngineeringValue.parse(text, kind), text);
    }

    // Offsets are 0-based indexes of the offending character (or of the end, where a digit
    // was still expected).
    @ParameterizedTest
    @CsvSource({
        "4kk7, 2", "4k7k, 3", "1..2, 2", "--1, 1", "1e, 2", "1e+, 3", "k, 0", "R, 0", "+1, 0",
        "4.7R, 3", "1e3k, 3", "1 k7, 3", "4 .7, 2", "4k7.5, 3", "1h, 1", "F, 0", "x, 0", "., 1",
    })
    void rejectsBadSyntaxAtTheOffendingCharacter(String text, int offset) {
        ValueFormatException e = rejected(text, C);
        assertEquals(offset, e.offset(), e.getMessage());
        assertEquals("expected a value such as 4k7 or 22n, found '" + text + "'", e.getMessage());
    }

    @Test
    void rejectsEmptyAndBlankText() {
        assertEquals(0, rejected("", R).offset());
        assertEquals(0, rejected("   ", R).offset());
        assertEquals("expected a value such as 4k7 or 22n, found ''", rejected("", R).getMessage());
    }

    @Test
    void offsetCountsLeadingWhitespace() {
        assertEquals(4, rejected("  4kk7", R).offset());
    }

    @Test
    void rejectsZeroNegativeAndNonFinite() {
        for (String zero : new String[] {"0", "0R", "0.0", "0e5", "0k0", "-0"}) {
            assertTrue(rejected(zero, R).getMessage().contains("greater than zero"), zero);
        }
        ValueFormatException negative = rejected("-1k", R);
        assertEquals(0, negative.offset());
        assertEquals("value '-1k' is negative; a resistor value must be greater than zero", negative.getMessage());
        for (String word : new String[] {"nan", "NaN", "inf", "Infinity", "-inf"}) {
            assertTrue(rejected(word, R).getMessage().contains("not a finite number"), word);
        }
        assertTrue(rejected("1e400", R).getMessage().contains("too large"));
        assertTrue(rejected("1e-400", R).getMessage().contains("too small"));
    }

    @Test
    void rejectsUnitsOfAnotherKind() {
        ValueFormatException e = rejected("22nH", C);
        assertEquals(3, e.offset());
        assertTrue(e.getMessage().startsWith("unit H does not fit a capacitor"), e.getMessage());
        assertTrue(rejected("47kF", R).getMessage().startsWith("unit F does not fit a resistor"));
        assertTrue(rejected("1k\u03A9", L).getMessage().startsWith("unit \u03A9 does not fit an inductor"));
        assertTrue(rejected("1 ohm", C).getMessage().startsWith("unit ohm does not fit a capacitor"));
    }

    @Test
    void valueFormatExceptionIsAnIllegalArgumentException() {
        assertThrows(IllegalArgumentException.class, () -> EngineeringValue.parse("4kk7", R));
    }

    // Expected texts follow the conventions documented on format(); the letter code itself
    // is IEC 60062 (from memory).
    @ParameterizedTest
    @CsvSource({
        "4700, RESISTOR, 4k7", "470, RESISTOR, 470R", "4.7, RESISTOR, 4R7", "1, RESISTOR, 1R",
        "0.47, RESISTOR, R47", "0.1, RESISTOR, R1", "0.047, RESISTOR, 47m", "2.2e6, RESISTOR, 2M2",
        "1e6, RESISTOR, 1M", "1e9, RESISTOR, 1G", "3.3e12, RESISTOR, 3T3", "999e12, RESISTOR, 999T",
        "3.3e-9, CAPACITOR, 3n3", "1e-6, CAPACITOR, 1u", "100e-12, CAPACITOR, 100p", "0.47, CAPACITOR, 470m",
        "4.7e-7, CAPACITOR, 470n", "5e-13, CAPACITOR, p5", "1e-15, CAPACITOR, p001", "1.5e-16, CAPACITOR, 1.5e-16",
        "1e15, RESISTOR, 1e15", "10e-3, INDUCTOR, 10m", "4.7e-6, INDUCTOR, 4u7", "12345.6789, RESISTOR, 12k3456789",
    })
    void formatsLetterCode(double value, ComponentKind kind, String expected) {
        assertEquals(expected, EngineeringValue.format(value, kind));
    }

    @ParameterizedTest
    @CsvSource({
        "4700, RESISTOR, 4.7 k\u03A9", "470, RESISTOR, 470 \u03A9", "0.47, RESISTOR, 470 m\u03A9",
        "3.3e-9, CAPACITOR, 3.3 nF", "1e-6, CAPACITOR, 1 \u00B5F", "100e-12, CAPACITOR, 100 pF",
        "10e-3, INDUCTOR, 10 mH", "1.5e6, RESISTOR, 1.5 M\u03A9", "1.5e-16, CAPACITOR, 1.5e-16 F",
    })
    void formatsSi(double value, ComponentKind kind, String expected) {
        assertEquals(expected, EngineeringValue.formatSi(value, kind));
    }

    @Test
    void formatRejectsValuesThatAreNotPositiveAndFinite() {
        for (double bad : new double[] {0, -1, Double.NaN, Double.POSITIVE_INFINITY}) {
            IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                    () -> EngineeringValue.format(bad, R));
            assertTrue(e.getMessage().contains(String.valueOf(bad)), e.getMessage());
            assertThrows(IllegalArgumentException.class, () -> EngineeringValue.formatSi(bad, C));
        }
    }

    /** E96 mantissas, IEC 60063:2015, transcribed from memory (same list as ESeriesTest). */
    private static final String[] E96 = ESeriesTest.E96;

    @Test
    void everyE96ValueRoundTripsWithAtMostThreeDigits() {
        for (ComponentKind kind : ComponentKind.values()) {
            for (int decade = -12; decade <= 7; decade++) {
                for (String m : E96) {
                    double v = Double.parseDouble(m + "e" + decade);
                    String code = EngineeringValue.format(v, kind);
                    // 1e-12 relative is the round-trip requirement for standard values.
                    assertEquals(v, EngineeringValue.parse(code, kind), 1e-12 * v, code);
                    assertTrue(code.chars().filter(Character::isDigit).count() <= 3, code);
                    String si = EngineeringValue.formatSi(v, kind);
                    assertEquals(v, EngineeringValue.parse(si, kind), 1e-12 * v, si);
                }
            }
        }
    }

    @Test
    void arbitraryValuesRoundTripToTheDocumentedPrecision() {
        Random random = new Random(20240601L);
        for (int i = 0; i < 5_000; i++) {
            double v = Math.pow(10, -18 + 36 * random.nextDouble());
            ComponentKind kind = ComponentKind.values()[random.nextInt(3)];
            String code = EngineeringValue.format(v, kind);
            String si = EngineeringValue.formatSi(v, kind);
            // format() keeps the fewest digits within ROUND_TRIP_RELATIVE; allow 1 ulp more
            // for the final conversion back to double.
            double slack = EngineeringValue.ROUND_TRIP_RELATIVE * v + Math.ulp(v);
            assertEquals(v, EngineeringValue.parse(code, kind), slack, code);
            assertEquals(v, EngineeringValue.parse(si, kind), slack, si);
        }
    }

    @Test
    void decimalsOfUpToEightDigitsRoundTripExactly() {
        Random random = new Random(7L);
        for (int i = 0; i < 5_000; i++) {
            int digits = 1 + random.nextInt(8);
            long mantissa = (long) Math.pow(10, digits - 1) + (long) (random.nextDouble() * 9 * Math.pow(10, digits - 1));
            double v = Double.parseDouble(mantissa + "e" + (random.nextInt(30) - 20));
            String code = EngineeringValue.format(v, R);
            assertEquals(v, EngineeringValue.parse(code, R), 0.0, code); // contract says exact
        }
    }
}
