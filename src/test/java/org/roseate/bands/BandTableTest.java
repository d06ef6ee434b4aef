package org.roseate.bands;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import org.junit.jupiter.api.Test;

class BandTableTest {
    private static final BandFraction OCT = BandFraction.OCTAVE;
    private static final BandFraction THIRD = BandFraction.THIRD_OCTAVE;

    /** One row of reference/iec61260_bands.csv. */
    private record Row(int b, int x, double midHz, double lowHz, double highHz) {
    }

    // reference: IEC 61260-1:2014 base-ten formulas evaluated with Python decimal at 40
    // digits, see src/test/python/gen_iec61260_bands.py
    private static List<Row> referenceRows() throws IOException {
        try (InputStream in = BandTableTest.class.getResourceAsStream("/reference/iec61260_bands.csv")) {
            assertTrue(in != null, "reference/iec61260_bands.csv is missing");
            List<Row> rows = new ArrayList<>();
            for (String line : new String(in.readAllBytes(), StandardCharsets.UTF_8).split("\n")) {
                if (line.isBlank() || line.startsWith("#") || line.startsWith("b,")) {
                    continue;
                }
                String[] f = line.split(",");
                rows.add(new Row(Integer.parseInt(f[0]), Integer.parseInt(f[1]), Double.parseDouble(f[2]),
                        Double.parseDouble(f[3]), Double.parseDouble(f[4])));
            }
            return rows;
        }
    }

    @Test
    void frequenciesMatchTheHighPrecisionReference() throws IOException {
        List<Row> rows = referenceRows();
        assertEquals(73, rows.size()); // 55 third-octave (x = -34..20) and 18 octave (x = -11..6)
        for (Row r : rows) {
            Band band = Band.of(r.x(), r.b() == 1 ? OCT : THIRD);
            // Math.pow is within 1 ulp and the ×1000 and exponent division add one rounding
            // each: 1e-14 relative covers that with margin.
            assertEquals(r.midHz(), band.midHz(), 1e-14 * r.midHz(), "mid " + r);
            assertEquals(r.lowHz(), band.lowHz(), 1e-14 * r.lowHz(), "low " + r);
            assertEquals(r.highHz(), band.highHz(), 1e-14 * r.highHz(), "high " + r);
        }
    }

    @Test
    void exactMidbandsMatchTheStandardsTable() {
        // IEC 61260-1:2014 Annex E, exact midband frequencies of the one-third-octave bands
        // (base ten), recalled from memory as printed to five significant digits; the
        // tolerance is half a unit in the last printed digit.
        double[][] xAndMid = {
            {-17, 19.953}, {-16, 25.119}, {-15, 31.623}, {-14, 39.811}, {-13, 50.119}, {-12, 63.096},
            {-11, 79.433}, {-10, 100.00}, {-9, 125.89}, {-8, 158.49}, {-7, 199.53}, {-6, 251.19},
            {-5, 316.23}, {-4, 398.11}, {-3, 501.19}, {-2, 630.96}, {-1, 794.33}, {0, 1000.0},
            {1, 1258.9}, {2, 1584.9}, {3, 1995.3}, {4, 2511.9}, {5, 3162.3}, {6, 3981.1},
            {7, 5011.9}, {8, 6309.6}, {9, 7943.3}, {10, 10000}, {11, 12589}, {12, 15849},
            {13, 19953},
        };
        for (double[] row : xAndMid) {
            double mid = row[1];
            double halfUnit = 0.5 * Math.pow(10, Math.floor(Math.log10(mid)) - 4);
            assertEquals(mid, Band.of((int) row[0], THIRD).midHz(), halfUnit, "x=" + row[0]);
        }
        // Same figures with more digits, as the brief quotes them (from memory).
        assertEquals(19.953, Band.of(-17, THIRD).midHz(), 0.0005);
        assertEquals(19952.6, Band.of(13, THIRD).midHz(), 0.05);
    }

    @Test
    void octaveEdgesOfTheOneKilohertzBand() {
        // IEC 61260-1:2014: 1000 · G^(∓1/2) with G = 10^0.3, i.e. 707.946 Hz and 1412.54 Hz
        // (from memory, six significant digits; tolerance half a unit in the last digit).
        Band b = Band.of(0, OCT);
        assertEquals(707.946, b.lowHz(), 0.0005);
        assertEquals(1412.54, b.highHz(), 0.005);
        assertEquals(1000.0, b.midHz(), 1e-12); // G^0 = 1; one rounding of pow
        assertEquals(1412.54 - 707.946, b.widthHz(), 0.006);
    }

    @Test
    void audioRangeCounts() {
        BandTable third = BandTable.of(THIRD, 20, 20000);
        assertEquals(31, third.size());
        assertEquals(20.0, third.band(0).nominalHz(), 0.0);
        assertEquals(20000.0, third.band(30).nominalHz(), 0.0);
        BandTable octave = BandTable.of(OCT, 20, 20000);
        assertEquals(10, octave.size());
        assertEquals(31.5, octave.band(0).nominalHz(), 0.0);
        assertEquals(16000.0, octave.band(9).nominalHz(), 0.0);
    }

    @Test
    void nominalLabelsFollowThePreferredNumbers() {
        // ISO 266 / IEC 61260-1 nominal midband frequencies (R10 preferred numbers), from memory.
        List<String> thirds = List.of("20", "25", "31.5", "40", "50", "63", "80", "100", "125", "160",
                "200", "250", "315", "400", "500", "630", "800", "1k", "1.25k", "1.6k", "2k", "2.5k",
                "3.15k", "4k", "5k", "6.3k", "8k", "10k", "12.5k", "16k", "20k");
        assertEquals(thirds, labels(BandTable.of(THIRD, 20, 20000)));
        List<String> octaves = List.of("31.5", "63", "125", "250", "500", "1k", "2k", "4k", "8k", "16k");
        assertEquals(octaves, labels(BandTable.of(OCT, 20, 20000)));
    }

    @Test
    void subAudioBandsExist() {
        // Third-octave nominals below 20 Hz continue the same R10 series (from memory).
        assertEquals(List.of("0.4", "0.5", "0.63", "0.8", "1", "1.25", "1.6", "2", "2.5", "3.15", "4", "5",
                        "6.3", "8", "10", "12.5", "16"),
                labels(BandTable.of(THIRD, 0.1, 17)));
        assertEquals(List.of("0.5", "1", "2", "4", "8", "16"), labels(BandTable.of(OCT, 0.1, 17)));
        assertEquals(List.of("50k", "63k", "80k", "100k"), labels(BandTable.of(THIRD, 45_000, 1e6)));
        assertEquals(0.8, BandTable.of(THIRD, 0.5, 2).find(0.8).orElseThrow().nominalHz(), 0.0);
    }

    @Test
    void nominalIsCloseToTheExactMidband() {
        // R10 preferred numbers differ from 10^(i/10) by at most 0.95 % (1.6 vs 1.585);
        // 1 % bounds that.
        for (BandFraction f : BandFraction.values()) {
            for (Band b : BandTable.of(f, 0.1, 1e6).bands()) {
                assertEquals(1.0, b.nominalHz() / b.midHz(), 0.01, b.label());
            }
        }
    }

    @Test
    void bandsAreContiguous() {
        for (BandFraction f : BandFraction.values()) {
            BandTable t = BandTable.of(f, 0.1, 1e6);
            double[] low = t.lowHz();
            double[] high = t.highHz();
            double[] mid = t.midHz();
            for (int i = 0; i + 1 < t.size(); i++) {
                // The edges are documented to be shared bit for bit; 1e-12 would be the
                // brief's minimum, equality is the stronger promise.
                assertEquals(high[i], low[i + 1], 0.0, f + " " + i);
            }
            for (int i = 0; i < t.size(); i++) {
                assertTrue(low[i] < mid[i] && mid[i] < high[i]);
                // Geometric centre: fm² = f1·f2 (IEC 61260-1 eqs. 4 and 5); 1e-14 for roundings.
                assertEquals(mid[i] * mid[i], low[i] * high[i], 1e-14 * mid[i] * mid[i]);
            }
        }
    }

    @Test
    void anOctaveSpansThreeThirdOctaves() {
        // Base-ten system: G^(1/2) = (G^(1/6))^3, so octave band x covers third-octave bands
        // 3x−1, 3x, 3x+1 exactly (IEC 61260-1:2014, 5.2).
        for (int x = Band.minIndex(OCT) + 1; x <= Band.maxIndex(OCT); x++) {
            Band octave = Band.of(x, OCT);
            assertEquals(Band.of(3 * x - 1, THIRD).lowHz(), octave.lowHz(), 0.0);
            assertEquals(Band.of(3 * x + 1, THIRD).highHz(), octave.highHz(), 0.0);
            assertEquals(Band.of(3 * x, THIRD).midHz(), octave.midHz(), 0.0);
            assertEquals(Band.of(3 * x, THIRD).nominalHz(), octave.nominalHz(), 0.0);
        }
    }

    @Test
    void relativeBandwidth() {
        // Closed form (f2 − f1)/fm = G^(1/(2b)) − G^(−1/(2b)) with G = 10^0.3, evaluated with
        // Python 3 floats: 0.704592 octave, 0.230768 third. A base-two band (G = 2) would give
        // 0.707107 and 0.231563, so the 1e-6 tolerance (rounding of the six printed digits)
        // also tells the two systems apart.
        assertEquals(0.704592, Band.of(3, OCT).widthHz() / Band.of(3, OCT).midHz(), 1e-6);
        assertEquals(0.230768, Band.of(-7, THIRD).widthHz() / Band.of(-7, THIRD).midHz(), 1e-6);
    }

    @Test
    void findAndContaining() {
        BandTable t = BandTable.of(THIRD, 20, 20000);
        assertEquals(-15, t.find(31.5).orElseThrow().index());
        assertEquals(13, t.find(20000).orElseThrow().index());
        assertTrue(t.find(31.62).isEmpty());
        assertTrue(t.find(25000).isEmpty());
        assertEquals(0, t.containing(1000).orElseThrow().index());
        Band b = t.band(5);
        assertEquals(Optional.of(b), t.containing(b.lowHz()));
        assertEquals(Optional.of(t.band(6)), t.containing(b.highHz())); // half-open [low, high)
        assertTrue(t.containing(t.band(30).highHz()).isEmpty());
        assertTrue(t.containing(Double.NaN).isEmpty());
    }

    @Test
    void rangeSlackIsTiny() {
        assertEquals(31, BandTable.of(THIRD, 20 * (1 + 1e-10), 20000 * (1 - 1e-10)).size());
        assertEquals(29, BandTable.of(THIRD, 20 * (1 + 1e-6), 20000 * (1 - 1e-6)).size());
    }

    @Test
    void arraysAreCopies() {
        BandTable t = BandTable.of(OCT, 20, 20000);
        t.lowHz()[0] = -1;
        t.midHz()[0] = -1;
        t.highHz()[0] = -1;
        assertTrue(t.lowHz()[0] > 0 && t.midHz()[0] > 0 && t.highHz()[0] > 0);
        assertThrows(UnsupportedOperationException.class, () -> t.bands().clear());
    }

    @Test
    void rangeChecksQuoteTheValues() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> BandTable.of(THIRD, 0, 100));
        assertTrue(e.getMessage().contains("loHz=0.0"), e.getMessage());
        assertThrows(IllegalArgumentException.class, () -> BandTable.of(THIRD, 100, 10));
        assertThrows(IllegalArgumentException.class, () -> BandTable.of(THIRD, 100, 100));
        assertThrows(IllegalArgumentException.class, () -> BandTable.of(THIRD, Double.NaN, 10));
        assertThrows(IllegalArgumentException.class, () -> BandTable.of(THIRD, 10, Double.POSITIVE_INFINITY));
        e = assertThrows(IllegalArgumentException.class, () -> BandTable.of(THIRD, 150_000, 200_000));
        assertTrue(e.getMessage().contains("150000.0"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class, () -> BandTable.of(THIRD, 25.5, 30));
        assertTrue(e.getMessage().startsWith("no third-octave band"), e.getMessage());
    }

    @Test
    void bandConstructorKeepsBandsReal() {
        Band good = Band.of(0, THIRD);
        assertEquals(good, new Band(0, THIRD, good.nominalHz(), good.midHz(), good.lowHz(), good.highHz()));
        assertThrows(IllegalArgumentException.class,
                () -> new Band(0, THIRD, 1000, 1001, good.lowHz(), good.highHz()));
        assertThrows(IllegalArgumentException.class,
                () -> new Band(0, THIRD, 999, good.midHz(), good.lowHz(), good.highHz()));
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> Band.of(21, THIRD));
        assertEquals("index=21 must be within [-34, 20] for third-octave bands", e.getMessage());
        assertThrows(IllegalArgumentException.class, () -> Band.of(-12, OCT));
        assertThrows(IllegalArgumentException.class, () -> Band.of(7, OCT));
    }

    @Test
    void tableConstructorChecksItsBands() {
        assertThrows(IllegalArgumentException.class, () -> new BandTable(THIRD, List.of()));
        assertThrows(IllegalArgumentException.class,
                () -> new BandTable(THIRD, List.of(Band.of(0, THIRD), Band.of(2, THIRD))));
        assertThrows(IllegalArgumentException.class,
                () -> new BandTable(THIRD, List.of(Band.of(0, OCT))));
    }

    @Test
    void labelsOfSingleBands() {
        assertEquals("31.5", Band.of(-5, OCT).label());
        assertEquals("1k", Band.of(0, THIRD).label());
        assertEquals("12.5k", Band.of(11, THIRD).label());
        assertEquals("16", Band.of(-18, THIRD).label());
        assertEquals("0.8", Band.of(-31, THIRD).label());
    }

    @Test
    void fractionParsing() {
        assertEquals(1, OCT.b());
        assertEquals(3, THIRD.b());
        assertEquals(Optional.of(OCT), BandFraction.parse("octave"));
        assertEquals(Optional.of(OCT), BandFraction.parse(" Octave "));
        assertEquals(Optional.of(OCT), BandFraction.parse("1/1"));
        assertEquals(Optional.of(THIRD), BandFraction.parse("third"));
        assertEquals(Optional.of(THIRD), BandFraction.parse("THIRD-OCTAVE"));
        assertEquals(Optional.of(THIRD), BandFraction.parse("1/3"));
        assertFalse(BandFraction.parse("sixth").isPresent());
        assertFalse(BandFraction.parse(null).isPresent());
    }

    private static List<String> labels(BandTable t) {
        return t.bands().stream().map(Band::label).toList();
    }
}
