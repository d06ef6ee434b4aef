package org.roseate.value;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Optional;
import java.util.Random;
import org.junit.jupiter.api.Test;

class ESeriesTest {
    // All tables: IEC 60063:2015, transcribed from memory, typed independently of the main
    // code (which derives E48 … E192 from the rounding rule). E3/E6/E12/E24 are the published
    // two-digit tables; E192 holds 9.20 where rounding would give 9.19.
    static final String[] E3 = {"1.0", "2.2", "4.7"};
    static final String[] E6 = {"1.0", "1.5", "2.2", "3.3", "4.7", "6.8"};
    static final String[] E12 = {"1.0", "1.2", "1.5", "1.8", "2.2", "2.7", "3.3", "3.9", "4.7", "5.6", "6.8", "8.2"};
    static final String[] E24 = {
        "1.0", "1.1", "1.2", "1.3", "1.5", "1.6", "1.8", "2.0", "2.2", "2.4", "2.7", "3.0",
        "3.3", "3.6", "3.9", "4.3", "4.7", "5.1", "5.6", "6.2", "6.8", "7.5", "8.2", "9.1",
    };
    static final String[] E48 = {
        "1.00", "1.05", "1.10", "1.15", "1.21", "1.27", "1.33", "1.40", "1.47", "1.54", "1.62", "1.69",
        "1.78", "1.87", "1.96", "2.05", "2.15", "2.26", "2.37", "2.49", "2.61", "2.74", "2.87", "3.01",
        "3.16", "3.32", "3.48", "3.65", "3.83", "4.02", "4.22", "4.42", "4.64", "4.87", "5.11", "5.36",
        "5.62", "5.90", "6.19", "6.49", "6.81", "7.15", "7.50", "7.87", "8.25", "8.66", "9.09", "9.53",
    };
    static final String[] E96 = {
        "1.00", "1.02", "1.05", "1.07", "1.10", "1.13", "1.15", "1.18", "1.21", "1.24", "1.27", "1.30",
        "1.33", "1.37", "1.40", "1.43", "1.47", "1.50", "1.54", "1.58", "1.62", "1.65", "1.69", "1.74",
        "1.78", "1.82", "1.87", "1.91", "1.96", "2.00", "2.05", "2.10", "2.15", "2.21", "2.26", "2.32",
        "2.37", "2.43", "2.49", "2.55", "2.61", "2.67", "2.74", "2.80", "2.87", "2.94", "3.01", "3.09",
        "3.16", "3.24", "3.32", "3.40", "3.48", "3.57", "3.65", "3.74", "3.83", "3.92", "4.02", "4.12",
        "4.22", "4.32", "4.42", "4.53", "4.64", "4.75", "4.87", "4.99", "5.11", "5.23", "5.36", "5.49",
        "5.62", "5.76", "5.90", "6.04", "6.19", "6.34", "6.49", "6.65", "6.81", "6.98", "7.15", "7.32",
        "7.50", "7.68", "7.87", "8.06", "8.25", "8.45", "8.66", "8.87", "9.09", "9.31", "9.53", "9.76",
    };
    static final String[] E192 = {
        "1.00", "1.01", "1.02", "1.04", "1.05", "1.06", "1.07", "1.09", "1.10", "1.11", "1.13", "1.14",
        "1.15", "1.17", "1.18", "1.20", "1.21", "1.23", "1.24", "1.26", "1.27", "1.29", "1.30", "1.32",
        "1.33", "1.35", "1.37", "1.38", "1.40", "1.42", "1.43", "1.45", "1.47", "1.49", "1.50", "1.52",
        "1.54", "1.56", "1.58", "1.60", "1.62", "1.64", "1.65", "1.67", "1.69", "1.72", "1.74", "1.76",
        "1.78", "1.80", "1.82", "1.84", "1.87", "1.89", "1.91", "1.93", "1.96", "1.98", "2.00", "2.03",
        "2.05", "2.08", "2.10", "2.13", "2.15", "2.18", "2.21", "2.23", "2.26", "2.29", "2.32", "2.34",
        "2.37", "2.40", "2.43", "2.46", "2.49", "2.52", "2.55", "2.58", "2.61", "2.64", "2.67", "2.71",
        "2.74", "2.77", "2.80", "2.84", "2.87", "2.91", "2.94", "2.98", "3.01", "3.05", "3.09", "3.12",
        "3.16", "3.20", "3.24", "3.28", "3.32", "3.36", "3.40", "3.44", "3.48", "3.52", "3.57", "3.61",
        "3.65", "3.70", "3.74", "3.79", "3.83", "3.88", "3.92", "3.97", "4.02", "4.07", "4.12", "4.17",
        "4.22", "4.27", "4.32", "4.37", "4.42", "4.48", "4.53", "4.59", "4.64", "4.70", "4.75", "4.81",
        "4.87", "4.93", "4.99", "5.05", "5.11", "5.17", "5.23", "5.30", "5.36", "5.42", "5.49", "5.56",
        "5.62", "5.69", "5.76", "5.83", "5.90", "5.97", "6.04", "6.12", "6.19", "6.26", "6.34", "6.42",
        "6.49", "6.57", "6.65", "6.73", "6.81", "6.90", "6.98", "7.06", "7.15", "7.23", "7.32", "7.41",
        "7.50", "7.59", "7.68", "7.77", "7.87", "7.96", "8.06", "8.16", "8.25", "8.35", "8.45", "8.56",
        "8.66", "8.76", "8.87", "8.98", "9.09", "9.20", "9.31", "9.42", "9.53", "9.65", "9.76", "9.88",
    };

    private static double[] parse(String[] table) {
        double[] out = new double[table.length];
        for (int i = 0; i < table.length; i++) {
            out[i] = Double.parseDouble(table[i]);
        }
        return out;
    }

    private static void assertTable(ESeries series, String[] table) {
        assertEquals(table.length, series.valuesPerDecade(), series.name());
        double[] expected = parse(table);
        double[] actual = series.mantissas();
        for (int i = 0; i < expected.length; i++) {
            // Both sides are the double nearest the same decimal, so they must be identical.
            assertEquals(expected[i], actual[i], 0.0, series + " member " + i);
        }
    }

    @Test
    void mantissasMatchTheTranscribedTables() {
        assertTable(ESeries.E3, E3);
        assertTable(ESeries.E6, E6);
        assertTable(ESeries.E12, E12);
        assertTable(ESeries.E24, E24);
        assertTable(ESeries.E48, E48);
        assertTable(ESeries.E96, E96);
        assertTable(ESeries.E192, E192);
    }

    @Test
    void mantissasIsACopy() {
        double[] m = ESeries.E12.mantissas();
        m[0] = 42;
        assertEquals(1.0, ESeries.E12.mantissas()[0], 0.0);
    }

    @Test
    void everyStandardValueIsItsOwnNearestAndIsContained() {
        for (ESeries s : ESeries.values()) {
            for (int decade = -13; decade <= 9; decade++) {
                for (double m : s.mantissas()) {
                    double v = Double.parseDouble(m + "e" + decade);
                    assertEquals(v, s.nearest(v), 0.0, s + " " + v); // exact: same decimal
                    assertTrue(s.contains(v), s + " " + v);
                    assertTrue(s.contains(v * (1 + 5e-10)), s + " " + v); // within RELATIVE_SLACK
                }
            }
        }
    }

    @Test
    void nearestIsLogarithmicAndCrossesDecades() {
        // Expected values reasoned from the tables above: the geometric midpoint of
        // 1.0 and 1.2 is 1.0954, of 6.8 and 10 is 8.246, of 3.0 and 3.3 is 3.146.
        assertEquals(1.0, ESeries.E12.nearest(1.09), 0.0);
        assertEquals(1.2, ESeries.E12.nearest(1.1), 0.0);
        assertEquals(10.0, ESeries.E12.nearest(9.6), 0.0);
        assertEquals(1.0, ESeries.E6.nearest(0.9), 0.0);
        assertEquals(6.8e-10, ESeries.E6.nearest(8.2e-10), 0.0);
        assertEquals(1e-9, ESeries.E6.nearest(8.3e-10), 0.0);
        assertEquals(3.3e3, ESeries.E24.nearest(3.2e3), 0.0);
        assertEquals(4.7e3, ESeries.E12.nearest(4.6e3), 0.0);
        assertEquals(9.20, ESeries.E192.nearest(9.21), 0.0);
    }

    @Test
    void nearestHasNoCloserNeighbour() {
        Random random = new Random(60063L);
        for (ESeries s : ESeries.values()) {
            for (int i = 0; i < 2_000; i++) {
                double v = Math.pow(10, -12 + 20 * random.nextDouble());
                double n = s.nearest(v);
                double distance = Math.abs(Math.log(v / n));
                // The neighbours of the answer are at least as far away in log terms.
                assertTrue(Math.abs(Math.log(v / s.stepUp(n))) >= distance, s + " " + v);
                assertTrue(Math.abs(Math.log(v / s.stepDown(n))) >= distance, s + " " + v);
                assertTrue(s.contains(n));
            }
        }
    }

    @Test
    void stepUpAndDownGoToTheNeighbour() {
        assertEquals(5600, ESeries.E12.stepUp(4700), 0.0);
        assertEquals(3900, ESeries.E12.stepDown(4700), 0.0);
        assertEquals(5600, ESeries.E12.stepUp(4800), 0.0);
        assertEquals(4700, ESeries.E12.stepDown(4800), 0.0);
        assertEquals(10000, ESeries.E12.stepUp(8200), 0.0);
        assertEquals(820, ESeries.E12.stepDown(1000), 0.0);
        assertEquals(5600, ESeries.E12.stepUp(4700 * (1 + 1e-12)), 0.0); // still "standard" within slack
        assertEquals(1.02e-9, ESeries.E96.stepUp(1e-9), 0.0);
        assertEquals(9.76e-10, ESeries.E96.stepDown(1e-9), 0.0);
        assertEquals(9.31, ESeries.E192.stepUp(9.20), 0.0);
        assertEquals(9.09, ESeries.E192.stepDown(9.20), 0.0);
    }

    @Test
    void valuesBetweenIsInclusiveAndAscending() {
        assertArrayEquals(new double[] {1000, 1200, 1500, 1800, 2200, 2700, 3300, 3900, 4700, 5600, 6800, 8200, 10000},
                ESeries.E12.valuesBetween(1000, 10000), 0.0);
        assertArrayEquals(new double[] {1, 2.2, 4.7, 10, 22, 47}, ESeries.E3.valuesBetween(0.5, 50), 0.0);
        assertArrayEquals(new double[] {4.7e-9}, ESeries.E6.valuesBetween(4.7e-9, 4.7e-9), 0.0);
        assertEquals(0, ESeries.E3.valuesBetween(5, 9).length);
        assertEquals(96 * 3 + 1, ESeries.E96.valuesBetween(1e-9, 1e-6).length);
        assertThrows(IllegalArgumentException.class, () -> ESeries.E12.valuesBetween(2, 1));
        assertThrows(IllegalArgumentException.class, () -> ESeries.E12.valuesBetween(0, 1));
    }

    @Test
    void containsKnowsTheIrregularMembers() {
        assertTrue(ESeries.E24.contains(3.0e3));
        assertFalse(ESeries.E12.contains(3.0e3));
        assertTrue(ESeries.E24.contains(8.2e-9));
        assertTrue(ESeries.E192.contains(9.20));
        assertFalse(ESeries.E192.contains(9.19));
        assertFalse(ESeries.E12.contains(4.7e3 * (1 + 1e-6)));
        assertFalse(ESeries.E12.contains(0));
        assertFalse(ESeries.E12.contains(-4.7));
        assertFalse(ESeries.E12.contains(Double.NaN));
        assertFalse(ESeries.E12.contains(Double.POSITIVE_INFINITY));
    }

    @Test
    void eachSeriesIsASubsetOfTheNextFiner() {
        // IEC 60063 structure: E3 ⊂ E6 ⊂ E12 ⊂ E24 and E48 ⊂ E96 ⊂ E192.
        ESeries[][] chains = {{ESeries.E3, ESeries.E6, ESeries.E12, ESeries.E24}, {ESeries.E48, ESeries.E96, ESeries.E192}};
        for (ESeries[] chain : chains) {
            for (int i = 0; i + 1 < chain.length; i++) {
                for (double m : chain[i].mantissas()) {
                    assertTrue(chain[i + 1].contains(m), chain[i] + " " + m + " in " + chain[i + 1]);
                }
            }
        }
    }

    @Test
    void argumentsAreChecked() {
        for (double bad : new double[] {0, -1, Double.NaN, Double.POSITIVE_INFINITY}) {
            IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> ESeries.E12.nearest(bad));
            assertEquals("value=" + bad + " must be finite and > 0", e.getMessage());
            assertThrows(IllegalArgumentException.class, () -> ESeries.E12.stepUp(bad));
            assertThrows(IllegalArgumentException.class, () -> ESeries.E12.stepDown(bad));
        }
    }

    @Test
    void parseIgnoresCase() {
        assertEquals(Optional.of(ESeries.E24), ESeries.parse("E24"));
        assertEquals(Optional.of(ESeries.E96), ESeries.parse("e96"));
        assertEquals(Optional.of(ESeries.E192), ESeries.parse(" E192 "));
        assertTrue(ESeries.parse("E5").isEmpty());
        assertTrue(ESeries.parse("").isEmpty());
        assertTrue(ESeries.parse(null).isEmpty());
        assertTrue(ESeries.parse("24").isEmpty());
    }
}
