package org.roseate.measure;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import java.util.random.RandomGenerator;
import java.util.random.RandomGeneratorFactory;
import org.junit.jupiter.api.Test;
import org.roseate.bands.BandFraction;
import org.roseate.bands.BandTable;
import org.roseate.circuit.DesignReader;
import org.roseate.compare.FrequencyRange;
import org.roseate.compare.TargetSlope;
import org.roseate.model.CircuitModel;
import org.roseate.noise.ChainSettings;
import org.roseate.noise.NoiseChain;

/**
 * The pipeline's derived figures against repeated seeded renders: the slope's and the peak deviation's
 * ± against their observed spread, tone marks, and coherence marks in transfer mode.
 */
class MeasureStatisticsTest {
    private static final int FS = 48000;

    private static MeasureResult measure(MeasureRequest q, double[] interleaved, int channels, double codeFs) {
        MeasurePipeline p = new MeasurePipeline(q, "test", FS, channels, codeFs);
        int frames = interleaved.length / channels;
        p.checkLength(frames);
        p.accept(interleaved, frames);
        return p.result(true);
    }

    private static double[] render(NoiseChain chain, double seconds) {
        int n = (int) (seconds * FS);
        double[] x = new double[n * chain.channels()];
        chain.render(x, n);
        return x;
    }

    private static double mean(double[] a) {
        double s = 0;
        for (double v : a) {
            s += v;
        }
        return s / a.length;
    }

    private static double std(double[] a) {
        double m = mean(a);
        double s = 0;
        for (double v : a) {
            s += (v - m) * (v - m);
        }
        return Math.sqrt(s / (a.length - 1));
    }

    /**
     * The sample standard deviation of R normal values has relative standard error 1/√(2(R − 1))
     * (a chi distribution with R − 1 degrees of freedom, from memory); 3 of those.
     */
    private static double ratioBound(int r) {
        return 3 / Math.sqrt(2.0 * (r - 1));
    }

    @Test
    void slopeAndPeakUncertaintyMatchTheSpreadOfSeededRenders() {
        CircuitModel model = CircuitModel.of(DesignReader.read(Path.of("presets/bench-pink.json")), "bench-pink.json");
        BandTable table = BandTable.of(BandFraction.THIRD_OCTAVE, 20, 20000);
        // against a white target the pink design's centred deviation is a ramp whose far end (the 20 Hz band)
        // is the peak in every render, so the peak's ± is that band's centred ±
        MeasureRequest q = MeasureRequest.noiseSource(table, FrequencyRange.AUDIO, TargetSlope.WHITE);
        int renders = 40;
        double[] slope = new double[renders];
        double[] slopeU = new double[renders];
        double[] peak = new double[renders];
        double[] peakU = new double[renders];
        int tones = 0;
        for (int k = 0; k < renders; k++) {
            NoiseChain chain = NoiseChain.design(model.zpk(), new ChainSettings(FS, 1, false, 1000L + k, -20));
            MeasureResult r = measure(q, render(chain, 6), 1, 0);
            slope[k] = r.slopeDbPerOctave().value();
            slopeU[k] = r.slopeDbPerOctave().uncertainty();
            peak[k] = r.maxBandDeviationDb().value();
            peakU[k] = r.maxBandDeviationDb().uncertainty();
            tones += (int) r.bands().stream().filter(BandResult::toneDominated).count();
            assertEquals(table.size(), r.countedBands(), "noise from a design: every band counts");
        }
        double b = ratioBound(renders);
        double slopeRatio = std(slope) / mean(slopeU);
        double peakRatio = std(peak) / mean(peakU);
        assertTrue(Math.abs(slopeRatio - 1) < b, "slope: observed σ " + std(slope) + " vs stated ± " + mean(slopeU));
        assertTrue(Math.abs(peakRatio - 1) < b, "peak: observed σ " + std(peak) + " vs stated ± " + mean(peakU));
        // the design's slope is the pink −3.01 dB/octave within the model's fidelity (NoiseChain ±0.1 dB per
        // band over ten octaves: ±0.02 dB/octave) and 4 of the stated ± of the mean of 40 renders
        assertEquals(TargetSlope.PINK.dbPerOctave(), mean(slope), 0.02 + 4 * mean(slopeU) / Math.sqrt(renders));
        // ToneDetector: a band of noise exceeds 20 times its median with probability about 1e-6 per bin
        assertEquals(0, tones, "no band of noise is taken for a tone");
    }

    @Test
    void aToneDominatedBandIsMarkedAndGetsNoNoiseUncertainty() {
        int n = 6 * FS;
        RandomGenerator g = RandomGeneratorFactory.<RandomGenerator>of("L64X128MixRandom").create(5);
        double[] x = new double[n];
        for (int i = 0; i < n; i++) {
            // a 1 kHz tone at −10 dBFS over white noise 60 dB below full scale
            x[i] = Math.pow(10, -10 / 20.0) * Math.sin(2 * Math.PI * 1000 * i / FS) + 1e-3 * g.nextGaussian();
        }
        BandTable table = BandTable.of(BandFraction.THIRD_OCTAVE, 100, 10000);
        MeasureResult r = measure(MeasureRequest.noiseSource(table, new FrequencyRange(100, 10000), TargetSlope.WHITE), x, 1, 0);
        for (BandResult b : r.bands()) {
            boolean isTone = b.band().nominalHz() == 1000;
            assertEquals(isTone, b.toneDominated(), b.band().label());
            assertEquals(isTone, Double.isNaN(b.uncertaintyDb()), b.band().label());
            assertEquals(!isTone, b.counted(), b.band().label());
        }
        // the 1 kHz band still reads the tone's level: −10 dBFS (AES17 full-scale sine 0 dBFS) within 0.01 dB
        double level = r.bands().stream().filter(b -> b.band().nominalHz() == 1000).findFirst().orElseThrow().levelDb();
        assertEquals(-10, level, 0.01);
        assertTrue(r.warnings().stream().anyMatch(w -> w.contains("dominated by a tone")));
    }

    @Test
    void uncorrelatedChannelsGiveOnlyUntrustedBands() {
        NoiseChain chain = NoiseChain.white(new ChainSettings(FS, 2, false, 77L, -20));
        double[] x = render(chain, 6);
        BandTable table = BandTable.of(BandFraction.THIRD_OCTAVE, 20, 20000);
        MeasureResult r = measure(MeasureRequest.transfer(table, FrequencyRange.AUDIO, null, 0, 1), x, 2, 0);
        // independent noise has γ² → 0; with K averages its estimate has mean about 1/K (Bendat & Piersol,
        // bias of the coherence estimate, from memory), far below 0.9
        for (BandResult b : r.bands()) {
            assertFalse(b.trusted(), b.band().label() + " γ² " + b.coherence());
            assertFalse(b.counted());
        }
        for (ResponsePoint p : r.points()) {
            assertFalse(p.trusted(), p.hz() + " Hz");
        }
        assertEquals(0, r.countedBands());
        assertTrue(Double.isNaN(r.slopeDbPerOctave().value()), "no trusted band, no slope");
        assertTrue(Double.isNaN(r.maxBandDeviationDb().value()), "no target asked for: no deviation");
        assertTrue(r.bands().stream().allMatch(b -> Double.isNaN(b.deviationDb())));
    }

    @Test
    void responsePointUncertaintyMatchesTheSpreadAtPartialCoherence() {
        // y = x + e with independent e of equal power: γ² = 1/2 at every frequency (closed form S_xx/(S_xx+S_ee))
        int renders = 40;
        int nseg = 4096;
        double hz = 85 * (double) FS / nseg; // exactly on bin 85, so no interpolation between bins
        BandTable table = BandTable.of(BandFraction.OCTAVE, 125, 8000);
        MeasureRequest q = MeasureRequest.transfer(table, new FrequencyRange(125, 8000), null, 0, 1)
                .withSegmentLength(nseg).withResponseHz(new double[] {hz});
        double[] db = new double[renders];
        double[] u = new double[renders];
        double[] coh = new double[renders];
        for (int k = 0; k < renders; k++) {
            RandomGenerator g = RandomGeneratorFactory.<RandomGenerator>of("L64X128MixRandom").create(300 + k);
            int n = 2 * FS;
            double[] x = new double[2 * n];
            for (int i = 0; i < n; i++) {
                double s = 0.1 * g.nextGaussian();
                x[2 * i] = s;
                x[2 * i + 1] = s + 0.1 * g.nextGaussian();
            }
            MeasureResult r = measure(q, x, 2, 0);
            ResponsePoint p = r.points().get(0);
            db[k] = p.db();
            u[k] = p.uncertaintyDb();
            coh[k] = p.coherence();
        }
        assertEquals(0.5, mean(coh), 0.05, "γ² of y = x + e, equal powers: 1/2 (closed form), estimate bias ~1/K");
        double ratio = std(db) / mean(u);
        assertTrue(Math.abs(ratio - 1) < ratioBound(renders), "observed σ " + std(db) + " dB vs stated ± " + mean(u));
    }
}
