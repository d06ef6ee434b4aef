package org.roseate.budget;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.roseate.bands.BandFraction;
import org.roseate.circuit.Design;
import org.roseate.circuit.DesignReader;

/**
 * Renders in volts against the budget: seeded records of a design with a source, their RMS, rate of
 * change and zero crossings against what the budget's densities say for the rendered band.
 *
 * <p><b>The bounds.</b> Each figure is averaged over K independent seeded records of T seconds.
 * <ul>
 * <li>Mean square: one record's mean square of a Gaussian process of one-sided density S has variance
 *     (1/T)·∫S² df (Bendat &amp; Piersol, Random Data, from memory; for noise flat over a band B it is
 *     σ⁴/(T·B), that is 1/(T·B) relative: the run length times the bandwidth), so the mean of K has
 *     standard deviation √(∫S² df/(K·T)). Four of those: a false failure under 1e-4 for a normal
 *     average. S here is the density the record holds (the digital path's response, see
 *     {@link VoltsRender}), so no allowance for the digital model is needed.</li>
 * <li>Rate of change: the same with the first difference's density (2·fs·sin(πf/fs))²·S.</li>
 * <li>Zero crossings: the exact expectation for samples of a Gaussian process is fs·arccos(ρ₁)/π
 *     sign changes per second (the orthant probability of two correlated normals), whose limit for
 *     fs → ∞ is Rice's formula. No closed form gives their scatter cheaply, so each record gives a
 *     batch-means standard error from 16 segments; four combined standard errors.</li>
 * </ul>
 */
class VoltsRenderStatisticsTest {
    static final double FS = 100;
    static final double SECONDS = 600;
    static final int RUNS = 10;

    /** An RC low-pass at 1.59 Hz (10 kΩ, 10 µF) driven by a source with a low 1/f corner; values invented. */
    static Design lowPass() {
        return BudgetFixtures.rcLowPass("10k", "10u", "\"source\": {\"densityVPerRtHz\": 200e-6, \"flickerCornerHz\": 0.2},");
    }

    static Design preset() {
        return DesignReader.read(Path.of("presets/random-voltage.json"));
    }

    @Test
    void lowPassRecordsAgreeWithTheBudget() {
        check(lowPass(), "rc", false);
    }

    @Test
    void randomVoltagePresetRecordsAgreeWithTheBudget() {
        check(preset(), "random-voltage.json", true);
    }

    /**
     * @param rateConverges false for a first-order low-pass, whose ∫(2πf)²S df grows with the band's top:
     *                      there the rate (and Rice's rate) of the record depend on the decimator's transition
     *                      band above fTop, which the budget over [1/T, fTop] leaves out (common practice:
     *                      a single-pole low-pass of white noise has no finite rate of change)
     */
    private static void check(Design d, String name, boolean rateConverges) {
        long frames = (long) (SECONDS * FS);
        double ms = 0;
        double rate2 = 0;
        double cross = 0;
        double crossVar = 0;
        VoltsRender.Expectation e = null;
        double[] buf = new double[4096];
        for (int k = 0; k < RUNS; k++) {
            VoltsRender r = VoltsRender.of(d, name, FS, SECONDS, 1, false, 1000 + k);
            e = r.expectation();
            RecordStatistics s = new RecordStatistics(FS, frames);
            long done = 0;
            while (done < frames) {
                int n = (int) Math.min(buf.length, frames - done);
                r.render(buf, n);
                s.accept(buf, 0, 1, n);
                done += n;
            }
            ms += s.rmsV() * s.rmsV() / RUNS;
            rate2 += s.sampledRateRmsVPerS() * s.sampledRateRmsVPerS() / RUNS;
            cross += s.crossingsPerS() / RUNS;
            crossVar += s.crossingsStandardErrorPerS() * s.crossingsStandardErrorPerS();
        }
        double e2 = e.rmsV() * e.rmsV();
        // σ of one record's RMS is ½·σ(mean square)/RMS, so σ(mean square) = 2·RMS·σ(RMS)
        double msSigma = 2 * e.rmsV() * e.rmsSigmaV() / Math.sqrt(RUNS);
        assertEquals(e2, ms, 4 * msSigma, name + ": mean square over " + RUNS + " records " + ms + " V², expected " + e2);
        double r2 = e.sampledRateRmsVPerS() * e.sampledRateRmsVPerS();
        double rSigma = 2 * e.sampledRateRmsVPerS() * e.sampledRateSigmaVPerS() / Math.sqrt(RUNS);
        assertEquals(r2, rate2, 4 * rSigma, name + ": rate of change");
        double crossSe = Math.sqrt(crossVar) / RUNS;
        assertEquals(e.sampledCrossingsPerS(), cross, 4 * crossSe, name + ": crossings");
        // Against the budget itself over [1/T, fTop] (NoiseBudget.compute, the analog circuit): the record's
        // expectation follows the digital path, every third-octave band within ±0.1 dB of the analog model,
        // so amplitudes (RMS, rate) within 10^(0.1/20) − 1 = 1.16 %, and Rice's rate, the square root of a
        // ratio of two such powers, within the same; 1.2 % leaves 0.04 % for the white part below 1/T and
        // the 1/f sum's ripple (both under 0.01 % for these designs by the same integrals).
        BudgetResult b = e.budget();
        assertEquals(b.outputRmsV(), e.rmsV(), 0.012 * b.outputRmsV(), name + ": RMS against the budget");
        if (rateConverges) {
            assertEquals(b.rateRmsVPerS(), e.rateRmsVPerS(), 0.012 * b.rateRmsVPerS(), name + ": rate against the budget");
            assertEquals(b.zeroCrossingsPerS(), e.zeroCrossingsPerS(), 0.012 * b.zeroCrossingsPerS(), name + ": Rice against the budget");
        }
        assertTrue(e.rmsSigmaV() > 0 && e.selfNoiseRmsV() > 0 && e.flickerCorners() > 0, "own noise, 1/f part and sampling error present");
    }
}
