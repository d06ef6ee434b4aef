package org.roseate.spectrum;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.io.InputStream;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.roseate.bands.Band;
import org.roseate.bands.BandFraction;
import org.roseate.bands.BandTable;

class FilterBankDesignTest {

    /**
     * Acceptance limits on relative attenuation: IEC 61260-1:2014 Table 1, class 1, transcribed from memory
     * and cross-checked against a third-party transcription of the table (the phonometry library's
     * compliance module); where the two disagreed we would have flagged it, and they did not. Octave-band
     * normalised frequencies Ω = G^x above midband (G = 10^(3/10)); the lower side is the mirror 1/Ω, and a
     * fraction 1/b uses the breakpoints Ω_b = 1 + (G^(1/(2b)) − 1)/(G^(1/2) − 1)·(Ω_1 − 1) (the standard's
     * formula for other bandwidths, from memory). Between breakpoints the limits are interpolated linearly
     * in lg Ω (the standard's rule, from memory).
     *
     * <p>Unsure, so read strictly: the standard states the band edge Ω = G^(1/2) with a pass-band maximum
     * (+5.3 dB) and a stop-band minimum (+1.2 dB). We take one row (min +1.2, max +5.3) at the edge and
     * interpolate the minimum from −0.4 dB at G^(3/8) to +1.2 dB at G^(1/2); a reading that keeps −0.4 dB up
     * to the edge is looser, so a filter that passes here passes it too. Less sure of the digits: the
     * pass-band maxima +0.5 (G^(1/8)) and +0.7 (G^(1/4)) dB.
     */
    static final class ClassOneLimits {
        static final double G = Math.pow(10, 0.3);
        /** exponent x of Ω = G^x, class 1 minimum dB, class 1 maximum dB (+∞: no maximum). */
        static final double[][] ROWS = {
                {0, -0.4, 0.4},
                {1.0 / 8, -0.4, 0.5},
                {1.0 / 4, -0.4, 0.7},
                {3.0 / 8, -0.4, 1.4},
                {1.0 / 2, 1.2, 5.3},
                {1, 16.6, Double.POSITIVE_INFINITY},
                {2, 40.5, Double.POSITIVE_INFINITY},
                {3, 60.0, Double.POSITIVE_INFINITY},
                {4, 70.0, Double.POSITIVE_INFINITY}, // and constant beyond G^4
        };

        /** Breakpoint Ω (≥ 1) of row r for the fraction 1/b. */
        static double omega(int row, int b) {
            double octave = Math.pow(G, ROWS[row][0]);
            return 1 + (Math.pow(G, 1.0 / (2 * b)) - 1) / (Math.sqrt(G) - 1) * (octave - 1);
        }

        /** {min, max} at normalised frequency omega = f/fm (either side). */
        static double[] at(double omega, int b) {
            double w = omega < 1 ? 1 / omega : omega;
            int last = ROWS.length - 1;
            if (w >= omega(last, b)) {
                return new double[] {ROWS[last][1], ROWS[last][2]};
            }
            for (int r = 0; r < last; r++) {
                double lo = omega(r, b);
                double hi = omega(r + 1, b);
                if (w >= lo && w <= hi) {
                    double t = Math.log(w / lo) / Math.log(hi / lo);
                    double min = ROWS[r][1] + t * (ROWS[r + 1][1] - ROWS[r][1]);
                    double max = Double.isInfinite(ROWS[r + 1][2]) ? Double.POSITIVE_INFINITY
                            : ROWS[r][2] + t * (ROWS[r + 1][2] - ROWS[r][2]);
                    return new double[] {min, max};
                }
            }
            throw new IllegalStateException("unreachable for omega=" + omega);
        }
    }

    private static JsonNode reference() throws IOException {
        try (InputStream in = FilterBankDesignTest.class.getResourceAsStream(
                "/reference/spectrum/filterbank/butter.json")) {
            if (in == null) {
                throw new IllegalStateException("missing /reference/spectrum/filterbank/butter.json");
            }
            return new ObjectMapper().readTree(in);
        }
    }

    @Test
    void responseMatchesScipyButterworthBandPass() throws IOException {
        // reference: scipy.signal.butter(3, [f1, f2], 'bandpass', fs=fs, output='sos') and sosfreqz,
        // scipy 1.17.1, see gen_filterbank_butter.py
        for (JsonNode c : reference().get("cases")) {
            BandFraction fraction = c.get("b").asInt() == 1 ? BandFraction.OCTAVE : BandFraction.THIRD_OCTAVE;
            Band band = Band.of(c.get("index").asInt(), fraction);
            double fs = c.get("fs").asDouble();
            // the generator's 40-digit band formulas and Band's doubles: 1e-12 relative is Band's own check
            assertEquals(c.get("f1").asDouble(), band.lowHz(), 1e-12 * band.lowHz());
            assertEquals(c.get("f2").asDouble(), band.highHz(), 1e-12 * band.highHz());
            FractionalOctaveFilter f = FractionalOctaveFilter.design(band, fs);
            JsonNode freqs = c.get("freqs");
            JsonNode magDb = c.get("magDb");
            for (int i = 0; i < freqs.size(); i++) {
                double hz = freqs.get(i).asDouble();
                double expected = magDb.get(i).asDouble();
                double actual = 20 * Math.log10(f.magnitude(hz));
                // 1e-6 dB (1.2e-7 relative): two double-precision realisations of the same design; the
                // narrowest case (20 Hz at 192 kHz) has poles 1.5e-4 from the unit circle, which amplifies
                // coefficient rounding by about 1e4 to ~1e-12, far below this
                assertEquals(expected, actual, 1e-6, band.label() + " at " + fs + " Hz, f=" + hz);
            }
        }
    }

    @Test
    void edgesAreMinusThreeDecibelsAndMidbandIsUnity() {
        for (double fs : new double[] {44100, 48000, 96000, 192000}) {
            for (Band b : BandTable.of(BandFraction.THIRD_OCTAVE, 20, 16000).bands()) {
                FractionalOctaveFilter f = FractionalOctaveFilter.design(b, fs);
                // Butterworth: |H|² = 1/2 at the prewarped edges, exactly by design (closed form); 1e-7
                // relative: evaluating 1 + a1·cos ω + a2·cos 2ω cancels to ~(1 − r)² ≈ 1e-8 for the 20 Hz band
                // at 44.1 kHz, so rounding of 1e-16 becomes ~1e-8 relative (seen: 6e-9)
                assertEquals(0.5, sq(f.magnitude(b.lowHz())), 0.5e-7, b.label());
                assertEquals(0.5, sq(f.magnitude(b.highHz())), 0.5e-7, b.label());
                // peak 1 at the digital centre (by design); at fm within 0.01 dB (the class's ±0.4 dB is far
                // wider; the centre departs from fm only through the bilinear warping)
                assertEquals(1.0, f.magnitude(f.centreHz()), 1e-12, b.label());
                assertEquals(0.0, 20 * Math.log10(f.magnitude(b.midHz())), 0.01, b.label());
            }
        }
    }

    /**
     * Every band the bank offers meets class 1, as the bank reads it (bands near Nyquist run at twice the
     * rate, their response including the interpolator and the image of the tone): third-octave 20 Hz to
     * 20 kHz at 48 and 96 kHz and to 16 kHz at 44.1 kHz (the 20 kHz band reaches 22.39 kHz, above half of
     * 44.1 kHz), octave 31.5 Hz to 16 kHz at 48 and 96 kHz and to 8 kHz at 44.1 kHz.
     */
    @Test
    void meetsClassOneLimitsAtTheBreakpointsAndBetween() {
        record Case(BandFraction fraction, double fs, double loHz, double hiHz) { }
        List<Case> cases = List.of(
                new Case(BandFraction.THIRD_OCTAVE, 48000, 20, 20000),
                new Case(BandFraction.THIRD_OCTAVE, 44100, 20, 16000),
                new Case(BandFraction.THIRD_OCTAVE, 96000, 20, 20000),
                new Case(BandFraction.OCTAVE, 48000, 31.5, 16000),
                new Case(BandFraction.OCTAVE, 44100, 31.5, 8000),
                new Case(BandFraction.OCTAVE, 96000, 31.5, 16000));
        int checked = 0;
        int doubled = 0;
        for (Case c : cases) {
            int b = c.fraction().b();
            FilterBank bank = new FilterBank();
            bank.prepare(c.fs(), BandTable.of(c.fraction(), c.loHz(), c.hiHz()));
            for (int i = 0; i < bank.table().size(); i++) {
                Band band = bank.table().band(i);
                doubled += bank.rateFactor(i) == 2 ? 1 : 0;
                List<Double> omegas = new ArrayList<>();
                for (int r = 0; r < ClassOneLimits.ROWS.length; r++) {
                    omegas.add(ClassOneLimits.omega(r, b));
                    omegas.add(1 / ClassOneLimits.omega(r, b));
                }
                // and a dense grid between G^-5 and G^5 (100 points per octave) for the interpolated limits
                for (int k = -500; k <= 500; k++) {
                    omegas.add(Math.pow(ClassOneLimits.G, k / 100.0));
                }
                for (double omega : omegas) {
                    double hz = omega * band.midHz();
                    if (hz >= c.fs() / 2) {
                        continue; // no signal exists there at this rate
                    }
                    double att = bank.relativeAttenuationDb(i, hz);
                    double[] lim = ClassOneLimits.at(omega, b);
                    // reference: IEC 61260-1:2014 Table 1, class 1, transcribed from memory (see ClassOneLimits)
                    assertTrue(att >= lim[0] && att <= lim[1], band.label() + " at fs=" + c.fs() + " (×" + bank.rateFactor(i)
                            + "), Ω=" + omega + ": ΔA=" + att + " dB outside [" + lim[0] + ", " + lim[1] + "]");
                    checked++;
                }
            }
        }
        assertTrue(checked > 50_000, "checked " + checked);
        // 48 kHz: 12.5, 16, 20 kHz third-octaves and the 16 kHz octave; 44.1 kHz: 10 k (upper edge 11.22 kHz),
        // 12.5 k, 16 k third-octaves and the 8 kHz octave; none at 96 kHz
        assertEquals(3 + 1 + 3 + 1, doubled);
    }

    @Test
    void topBandsAtBaseRatesMissClassOneOnTheLowSkirt() {
        // Why the bank runs these bands at twice the rate (FilterBank.DOUBLE_RATE_ABOVE_FRACTION): near Nyquist the bilinear warping widens the band in the
        // tan(πf/fs) domain (12.5 kHz third-octave at 48 kHz: relative width 0.39 instead of 0.23), so the
        // low skirt falls short of the class 1 minimum at the mirror of G^3 (60 dB). Measured margins
        // (dB): 12.5k −1.1, 16k −4.6, 20k −10.5 third-octave and 16k −7.2 octave at 48 kHz.
        double[][] failing = {{3, 11, 48000}, {3, 12, 48000}, {3, 13, 48000}, {1, 4, 48000}, {3, 11, 44100},
                {3, 12, 44100}, {1, 3, 44100}};
        for (double[] c : failing) {
            int b = (int) c[0];
            Band band = Band.of((int) c[1], b == 1 ? BandFraction.OCTAVE : BandFraction.THIRD_OCTAVE);
            FractionalOctaveFilter f = FractionalOctaveFilter.design(band, c[2]);
            double omega = 1 / ClassOneLimits.omega(7, b); // mirror of G^3 (row 7)
            // reference: IEC 61260-1:2014 Table 1, class 1 (transcribed from memory): 60 dB at G^3
            assertTrue(f.relativeAttenuationDb(omega * band.midHz()) < ClassOneLimits.at(omega, b)[0],
                    band.label() + " at " + c[2]);
        }
    }

    @Test
    void classOneTableRejectsAWiderLowerOrderFilter() {
        // the limits can fail: a first-order prototype (the single-tuned band-pass, |H|² = 1/(1 + x²)) has
        // ΔA = 10·lg(1 + x²) with x = (Ω − 1/Ω)/(G^(1/2) − G^(−1/2)) for an octave band (closed form); one
        // octave out that is 4.3 dB, below the class 1 minimum of 16.6 dB
        double omega = ClassOneLimits.G;
        double x = (omega - 1 / omega) / (Math.sqrt(ClassOneLimits.G) - 1 / Math.sqrt(ClassOneLimits.G));
        double att = 10 * Math.log10(1 + x * x);
        assertTrue(att < ClassOneLimits.at(omega, 1)[0], "first order: " + att);
        // and the same closed form for N = 3 (x⁶) clears it: 10·lg(1 + x⁶)
        assertTrue(10 * Math.log10(1 + Math.pow(x, 6)) > ClassOneLimits.at(omega, 1)[0]);
        // mapped breakpoints: the band edge maps to itself, G^(1/(2b)) (formula check, exact)
        assertEquals(Math.pow(ClassOneLimits.G, 1.0 / 6), ClassOneLimits.omega(4, 3), 1e-15);
    }

    @Test
    void noiseBandwidthFollowsTheButterworthFormula() {
        // ∫₀^∞ dx/(1 + x^(2N)) = (π/(2N))/sin(π/(2N)) (standard integral); N = 1 gives π/2, the noise bandwidth
        // of a single-tuned circuit (handbook value, from memory); N = 3 gives π/3 (sin(π/6) = 1/2)
        assertEquals(Math.PI / 2, FractionalOctaveFilter.butterworthNoiseBandwidthRatio(1), 1e-15);
        assertEquals(Math.PI / 3, FractionalOctaveFilter.butterworthNoiseBandwidthRatio(3), 1e-15);
        assertThrows(IllegalArgumentException.class, () -> FractionalOctaveFilter.butterworthNoiseBandwidthRatio(0));
        // the realised digital filter, far below Nyquist (warping (πf/fs)² ≈ 4e-5): 1e-3 relative covers the
        // warping and the Simpson grid
        for (BandFraction fr : BandFraction.values()) {
            Band b = BandTable.of(fr, 120, 130).band(0);
            FractionalOctaveFilter f = FractionalOctaveFilter.design(b, 48000);
            assertEquals(Math.PI / 3, f.noiseBandwidthHz() / b.widthHz(), 1e-3, fr.displayName());
        }
    }

    @Test
    void refusesBandsAtOrAboveNyquistAndBadRates() {
        Band top = BandTable.of(BandFraction.THIRD_OCTAVE, 19000, 21000).band(0);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> FractionalOctaveFilter.design(top, 44100));
        assertTrue(e.getMessage().contains("sampleRateHz=44100.0"), e.getMessage());
        for (double bad : new double[] {0, -48000, Double.NaN, Double.POSITIVE_INFINITY}) {
            IllegalArgumentException ex = assertThrows(IllegalArgumentException.class,
                    () -> FractionalOctaveFilter.design(top, bad));
            assertTrue(ex.getMessage().contains("sampleRateHz=" + bad), ex.getMessage());
        }
        FilterBank bank = new FilterBank();
        BandTable all = BandTable.of(BandFraction.THIRD_OCTAVE, 20, 20000);
        assertThrows(IllegalArgumentException.class, () -> bank.prepare(44100, all));
        assertThrows(IllegalStateException.class, bank::levels);
    }

    private static double sq(double v) {
        return v * v;
    }
}
