package org.roseate.measure;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Random;
import org.junit.jupiter.api.Test;
import org.roseate.bands.BandFraction;
import org.roseate.bands.BandTable;
import org.roseate.compare.FrequencyRange;

/**
 * Noise-source response points (what {@code diagnose} reads): on seeded white noise their level must
 * be the one-sided density 2σ²/fs FS²/Hz (Parseval's theorem with the one-sided convention, as
 * scipy.signal.welch's "density" scaling defines it), and their scatter must match their stated ±.
 */
class NoiseResponsePointsTest {
    private static final int RATE_HZ = 48000;
    private static final int SEGMENT = 4096;

    /** Seeds pooled: 5 × 60 points, so the χ² check below tells a ± off by √2 (χ² near n/2 or 2n) from right. */
    private static final int SEEDS = 5;

    @Test
    void whiteNoiseDensityPointsAreRightWithinTheirStatedScatter() {
        double chi2 = 0;
        int n = 0;
        for (int seed = 0; seed < SEEDS; seed++) {
            double[] one = chiSquare(70 + seed);
            chi2 += one[0];
            n += (int) one[1];
        }
        // χ² of n independent unit normals: mean n, standard deviation √(2n); 4 standard deviations
        // either way (neighbouring points share no bin, so they are nearly independent).
        double bound = 4 * Math.sqrt(2.0 * n);
        double c = chi2;
        int points = n;
        assertTrue(Math.abs(c - n) < bound, () -> "χ² = " + c + " for " + points + " points; the stated ± is off");
    }

    /** {χ², points} of one seeded record against the true density. */
    private static double[] chiSquare(long seed) {
        int frames = 1 << 20;
        double[] x = new double[frames];
        Random rnd = new Random(seed);
        double ms = 0;
        for (int i = 0; i < frames; i++) {
            x[i] = 0.1 * rnd.nextGaussian();
            ms += x[i] * x[i];
        }
        ms /= frames;
        double[] hz = new double[60];
        for (int i = 0; i < hz.length; i++) {
            // 24 per decade from 30 Hz: cells from one bin (11.7 Hz bins) at the low end to dozens
            hz[i] = 30 * Math.pow(10, i / 24.0);
        }
        MeasureRequest q = MeasureRequest.noiseSource(BandTable.of(BandFraction.OCTAVE, 250, 8000),
                new FrequencyRange(20, 20000), null).withSegmentLength(SEGMENT).withResponseHz(hz);
        MeasurePipeline p = new MeasurePipeline(q, "white", RATE_HZ, 1, 0);
        p.accept(x, frames);
        List<ResponsePoint> pts = p.result(true).points();
        assertEquals(hz.length, pts.size());
        double truthDb = 10 * Math.log10(2 * ms / RATE_HZ);
        double chi2 = 0;
        double df = (double) RATE_HZ / SEGMENT;
        for (ResponsePoint r : pts) {
            // each point sits on the bin nearest the asked frequency
            assertEquals(0, Math.IEEEremainder(r.hz(), df), 1e-9 * r.hz(), () -> "off-bin point " + r.hz());
            assertTrue(Double.isNaN(r.deg()) && r.trusted());
            double eps = Math.pow(10, r.uncertaintyDb() / 10) - 1;
            double sigmaDb = 10 / Math.log(10) * eps;
            double z = (r.db() - truthDb) / sigmaDb;
            chi2 += z * z;
        }
        return new double[] {chi2, pts.size()};
    }
}
