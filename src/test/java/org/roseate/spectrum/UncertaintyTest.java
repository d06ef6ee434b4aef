package org.roseate.spectrum;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.roseate.bands.BandFraction;
import org.roseate.bands.BandTable;

/**
 * The stated band uncertainty ε = 1/√(B·T_eff) against the scatter of repeated independent
 * captures of seeded white noise.
 */
class UncertaintyTest {
    private static final int RUNS = 300;
    /**
     * 12 %: the standard deviation estimated from 300 runs has a relative sampling error of
     * 1/√(2·299) ≈ 4.1 %, so this is three of those.
     */
    private static final double TOLERANCE = 0.12;

    private static void check(WelchSettings s, long seedBase) {
        double fs = 8000;
        int frames = 16000; // 2 s
        BandTable table = BandTable.of(BandFraction.OCTAVE, 125, 2000);
        double[][] power = new double[table.size()][RUNS];
        double[][] db = new double[table.size()][RUNS];
        List<BandLevel> last = null;
        WelchEstimator e = new WelchEstimator();
        e.prepare(fs, s);
        for (int r = 0; r < RUNS; r++) {
            e.reset();
            double[] x = SpectrumReference.gaussian(seedBase + r, frames, 0.1);
            e.accept(x, 0, x.length);
            last = BandLevels.of(e.snapshot(), table);
            for (int b = 0; b < table.size(); b++) {
                power[b][r] = last.get(b).power();
                db[b][r] = last.get(b).levelDb();
            }
        }
        for (int b = 0; b < table.size(); b++) {
            double observedEps = std(power[b]) / mean(power[b]);
            BandLevel stated = last.get(b);
            assertEquals(stated.relativeError(), observedEps, TOLERANCE * stated.relativeError(),
                    s.window() + " band " + stated.band().label());
            // the ± dB convention: 10·log10(1 + ε) is within a few per cent of the standard deviation of
            // the level in dB for ε below 0.1 (first-order: 4.34·ε)
            assertEquals(stated.uncertaintyDb(), std(db[b]), 0.15 * stated.uncertaintyDb(),
                    s.window() + " band " + stated.band().label() + " dB");
        }
    }

    @Test
    void hannAtHalfOverlapAgreesWithRepeatedCaptures() {
        check(WelchSettings.of(1024), 1000);
    }

    @Test
    void rectangularWithoutOverlapAgreesWithRepeatedCaptures() {
        // T_eff = T exactly here, ε = 1/√(B·T) (Bendat and Piersol's band-limited mean-square error)
        WelchSettings s = WelchSettings.of(1000).withWindow(Window.RECTANGULAR).withOverlap(0);
        WelchEstimator e = new WelchEstimator();
        e.prepare(8000, s);
        e.accept(new double[16000], 0, 16000);
        assertEquals(2.0, e.snapshot().effectiveDurationSeconds(), 1e-12);
        check(s, 5000);
    }

    @Test
    void hannHalfOverlapEffectiveDurationClosedForm() {
        // W(t) = Σ hann²(t − s·n/2) = 3/4 + 1/4·cos(4πt/n) away from the ends, so T_eff/T → (3/4)²/((3/4)² + 1/32)
        // = 18/19 for many segments (closed form); 2001 segments make the end effects ~1e-3
        WelchEstimator e = new WelchEstimator();
        e.prepare(1000, WelchSettings.of(100));
        e.accept(new double[100_050], 0, 100_050);
        double t = e.averages() * 50 / 1000.0;
        assertEquals(18.0 / 19.0, e.snapshot().effectiveDurationSeconds() / t, 2e-3);
    }

    private static double mean(double[] v) {
        double s = 0;
        for (double x : v) {
            s += x;
        }
        return s / v.length;
    }

    private static double std(double[] v) {
        double m = mean(v);
        double s = 0;
        for (double x : v) {
            s += (x - m) * (x - m);
        }
        return Math.sqrt(s / (v.length - 1));
    }
}
