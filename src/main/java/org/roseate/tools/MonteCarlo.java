package org.roseate.tools;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.Comparator;
import java.util.List;
import java.util.Objects;
import java.util.SplittableRandom;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.function.DoubleConsumer;
import org.roseate.bands.Band;
import org.roseate.bands.BandFraction;
import org.roseate.bands.BandTable;
import org.roseate.circuit.Component;
import org.roseate.circuit.Design;
import org.roseate.compare.FrequencyRange;
import org.roseate.compare.TargetSlope;
import org.roseate.value.Tolerance;

/**
 * Monte Carlo tolerance analysis: each trial draws every toleranced part from its
 * {@link Distribution} (tolerances from the design's {@code tolerance} map; parts without one
 * are held exact), and computes the band levels 10·log10 ∫|H|² df and their centred deviations
 * from the target, as {@link org.roseate.compare.DesignAnalysis#bandLevels} does. Trial i uses
 * its own generator seeded from (seed, i) by a SplitMix64 finaliser, so a result depends on the
 * seed only, never on the thread count. Also the sensitivity of each band level to each part.
 */
public final class MonteCarlo {
    private static final int HISTOGRAM_BINS = 20;
    /** Central-difference step in ln value for the sensitivities: ±1e-3 (0.1 %). */
    private static final double SENSITIVITY_STEP = 1e-3;

    private MonteCarlo() {
    }

    /**
     * The settings.
     *
     * @param trials  number of trials, 1 … 10⁷
     * @param limitDb the yield limit on the peak band deviation, dB, &gt; 0
     * @param threads worker threads, ≥ 1
     */
    public record Spec(Design design, FrequencyRange range, TargetSlope target, BandFraction fraction, int trials,
            Distribution distribution, long seed, double limitDb, int threads) {
        public Spec {
            Objects.requireNonNull(design, "design");
            Objects.requireNonNull(range, "range");
            Objects.requireNonNull(target, "target");
            Objects.requireNonNull(fraction, "fraction");
            Objects.requireNonNull(distribution, "distribution");
            if (trials < 1 || trials > 10_000_000) {
                throw new IllegalArgumentException("trials=" + trials + " must be 1 to 10000000");
            }
            if (!(limitDb > 0) || !Double.isFinite(limitDb)) {
                throw new IllegalArgumentException("limitDb=" + limitDb + " must be finite and > 0");
            }
            if (threads < 1) {
                throw new IllegalArgumentException("threads=" + threads + " must be >= 1");
            }
        }
    }

    /**
     * One band over the trials.
     *
     * @param nominalLevelDb     the nominal design's band level, dB
     * @param nominalDeviationDb the nominal design's centred deviation, dB
     * @param levelDb            percentiles of the band level, dB
     * @param deviationDb        percentiles of the centred deviation (each trial centred on its own), dB
     */
    public record BandSpread(Band band, double nominalLevelDb, double nominalDeviationDb, Quantiles levelDb,
            Quantiles deviationDb) {
    }

    /**
     * A part's effect on the band levels.
     *
     * @param designator        the part
     * @param tolerance         its tolerance, or null when held exact
     * @param levelDbPerPercent per band, the change of the band level for +1 % on the value:
     *                          0.01·∂L/∂ln v, by a central difference, dB
     * @param maxLevelDb        the largest |levelDbPerPercent|
     * @param maxShapeDb        the largest |levelDbPerPercent − its mean over the bands|: the part
     *                          of the effect that centring cannot remove (a change common to all
     *                          bands is only a gain change); the ranking key
     */
    public record PartSensitivity(String designator, Tolerance tolerance, double[] levelDbPerPercent,
            double maxLevelDb, double maxShapeDb) {
    }

    /**
     * A histogram of the peak band deviation.
     *
     * @param edgesDb bin edges, dB, one more than counts
     * @param counts  trials per bin (the last bin includes its upper edge)
     */
    public record Histogram(double[] edgesDb, int[] counts) {
    }

    /**
     * The result.
     *
     * @param bands          per band
     * @param peakDb         percentiles of the per-trial peak band deviation (maxBandDeviationDb), dB
     * @param peakSamplesDb  the per-trial peak band deviation, in trial order
     * @param histogram      of {@code peakSamplesDb}
     * @param yield          fraction of trials with peak ≤ limit
     * @param yieldStandardError √(y(1 − y)/N), the binomial standard error
     * @param nominalPeakDb  the nominal design's peak band deviation, dB
     * @param toleranced     designators drawn at random
     * @param exact          designators held exact (no tolerance given)
     * @param sensitivities  every part, ranked by {@link PartSensitivity#maxShapeDb()}, largest first
     */
    public record Result(Spec spec, BandTable table, List<BandSpread> bands, Quantiles peakDb, double[] peakSamplesDb,
            Histogram histogram, double yield, double yieldStandardError, double nominalPeakDb, List<String> toleranced,
            List<String> exact, List<PartSensitivity> sensitivities) {
    }

    /**
     * Runs the analysis.
     *
     * @param progress receives the fraction done, 0 … 1, from worker threads (thread-safe)
     */
    public static Result run(Spec spec, DoubleConsumer progress) {
        BandTable table = BandTable.of(spec.fraction(), spec.range().loHz(), spec.range().hiHz());
        PowerProgram program = PowerProgram.of(spec.design());
        Scorer scorer = new Scorer(program, spec.range(), spec.target(), table);
        List<Component> parts = program.parts();
        double[] nominal = program.nominal();
        double[] tol = new double[parts.size()];
        List<String> toleranced = new ArrayList<>();
        List<String> exact = new ArrayList<>();
        for (int i = 0; i < parts.size(); i++) {
            Component c = parts.get(i);
            var t = spec.design().toleranceOf(c);
            tol[i] = t.map(Tolerance::fraction).orElse(0.0);
            (t.isPresent() ? toleranced : exact).add(c.designator());
        }
        int nb = scorer.bandCount();
        int n = spec.trials();
        double[][] levels = new double[nb][n];
        double[][] devs = new double[nb][n];
        double[] peaks = new double[n];

        int threads = Math.min(spec.threads(), n);
        ExecutorService pool = Executors.newFixedThreadPool(threads, r -> {
            Thread t = new Thread(r, "roseate-montecarlo");
            t.setDaemon(true);
            return t;
        });
        try {
            List<Future<?>> fs = new ArrayList<>();
            java.util.concurrent.atomic.AtomicInteger done = new java.util.concurrent.atomic.AtomicInteger();
            int chunk = Math.max(1, (n + threads * 8 - 1) / (threads * 8));
            for (int from = 0; from < n; from += chunk) {
                final int a = from;
                final int b = Math.min(n, from + chunk);
                fs.add(pool.submit(() -> {
                    Scorer.Workspace w = scorer.workspace();
                    double[] values = new double[nominal.length];
                    double[] raw = new double[nb];
                    for (int trial = a; trial < b; trial++) {
                        SplittableRandom rnd = new SplittableRandom(Fitter.mix(spec.seed(), trial));
                        for (int i = 0; i < values.length; i++) {
                            values[i] = tol[i] == 0 ? nominal[i] : nominal[i] * (1 + tol[i] * draw(spec.distribution(), rnd));
                        }
                        scorer.bandLevels(values, w, raw);
                        store(trial, raw, scorer, levels, devs, peaks, table, spec.target());
                    }
                    progress.accept((double) done.addAndGet(b - a) / n);
                }));
            }
            for (Future<?> f : fs) {
                f.get();
            }
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IllegalStateException("Monte Carlo interrupted", e);
        } catch (ExecutionException e) {
            if (e.getCause() instanceof RuntimeException re) {
                throw re;
            }
            throw new IllegalStateException(e.getCause());
        } finally {
            pool.shutdownNow();
        }

        double[] nomLevels = new double[nb];
        Scorer.Workspace w = scorer.workspace();
        scorer.bandLevels(nominal, w, nomLevels);
        double[] nomDev = centred(nomLevels, table, spec.target());
        List<BandSpread> bands = new ArrayList<>();
        for (int i = 0; i < nb; i++) {
            bands.add(new BandSpread(table.band(i), nomLevels[i], nomDev[i], Quantiles.of(levels[i]), Quantiles.of(devs[i])));
        }
        int pass = 0;
        for (double p : peaks) {
            if (p <= spec.limitDb()) {
                pass++;
            }
        }
        double y = (double) pass / n;
        List<PartSensitivity> sens = new ArrayList<>();
        for (int i = 0; i < parts.size(); i++) {
            double[] s = bandSensitivity(scorer, w, nominal, i);
            double mean = Arrays.stream(s).average().orElse(0);
            double maxL = 0;
            double maxS = 0;
            for (double v : s) {
                maxL = Math.max(maxL, Math.abs(v));
                maxS = Math.max(maxS, Math.abs(v - mean));
            }
            Component c = parts.get(i);
            sens.add(new PartSensitivity(c.designator(), spec.design().toleranceOf(c).orElse(null), s, maxL, maxS));
        }
        sens.sort(Comparator.comparingDouble(PartSensitivity::maxShapeDb).reversed());
        return new Result(spec, table, bands, Quantiles.of(peaks), peaks, histogram(peaks), y, Math.sqrt(y * (1 - y) / n),
                Scorer.halfSpread(nomDev, nb), toleranced, exact, sens);
    }

    private static void store(int trial, double[] levelsDb, Scorer scorer, double[][] levels, double[][] devs,
            double[] peaks, BandTable table, TargetSlope target) {
        double[] d = centred(levelsDb, table, target);
        for (int i = 0; i < levelsDb.length; i++) {
            levels[i][trial] = levelsDb[i];
            devs[i][trial] = d[i];
        }
        peaks[trial] = Scorer.halfSpread(d, d.length);
    }

    /** Deviation from the target's band levels, centred by the minimax offset. */
    private static double[] centred(double[] levelsDb, BandTable table, TargetSlope target) {
        double[] d = new double[levelsDb.length];
        for (int i = 0; i < d.length; i++) {
            Band b = table.band(i);
            d[i] = levelsDb[i] - 10 * Math.log10(target.bandPower(b.lowHz(), b.highHz()));
        }
        double max = Arrays.stream(d).max().orElse(0);
        double min = Arrays.stream(d).min().orElse(0);
        double off = -(max + min) / 2;
        for (int i = 0; i < d.length; i++) {
            d[i] += off;
        }
        return d;
    }

    /** A deviate on [−1, 1]: uniform, or a standard normal truncated to ±3 and divided by 3. */
    static double draw(Distribution d, SplittableRandom rnd) {
        if (d == Distribution.UNIFORM) {
            return 2 * rnd.nextDouble() - 1;
        }
        while (true) {
            double z = Fitter.gaussian(rnd);
            if (Math.abs(z) <= Distribution.SIGMAS_PER_TOLERANCE) {
                return z / Distribution.SIGMAS_PER_TOLERANCE;
            }
        }
    }

    private static double[] bandSensitivity(Scorer scorer, Scorer.Workspace w, double[] nominal, int slot) {
        int nb = scorer.bandCount();
        double[] up = new double[nb];
        double[] down = new double[nb];
        double[] v = nominal.clone();
        v[slot] = nominal[slot] * Math.exp(SENSITIVITY_STEP);
        scorer.bandLevels(v, w, up);
        v[slot] = nominal[slot] * Math.exp(-SENSITIVITY_STEP);
        scorer.bandLevels(v, w, down);
        double[] s = new double[nb];
        for (int i = 0; i < nb; i++) {
            s[i] = 0.01 * (up[i] - down[i]) / (2 * SENSITIVITY_STEP);
        }
        return s;
    }

    /**
     * The pointwise sensitivity ∂(20·log10|H|)/∂(ln v) of one part at one frequency, dB per
     * neper of value change, by a central difference (step ±1e-4 in ln v, error O(1e-8)).
     *
     * @param hz finite, &gt; 0
     */
    public static double pointDbPerNeper(Design design, String designator, double hz) {
        if (!(hz > 0) || !Double.isFinite(hz)) {
            throw new IllegalArgumentException("hz=" + hz + " must be finite and > 0");
        }
        PowerProgram p = PowerProgram.of(design);
        int slot = p.slot(designator);
        if (slot < 0) {
            throw new IllegalArgumentException("no part '" + designator + "' in the design");
        }
        double h = 1e-4;
        double[] v = p.nominal();
        PowerProgram.Workspace w = p.workspace();
        double nominal = v[slot];
        v[slot] = nominal * Math.exp(h);
        p.load(v, w);
        double up = 10 * Math.log10(p.power(2 * Math.PI * hz, w));
        v[slot] = nominal * Math.exp(-h);
        p.load(v, w);
        double down = 10 * Math.log10(p.power(2 * Math.PI * hz, w));
        return (up - down) / (2 * h);
    }

    private static Histogram histogram(double[] peaks) {
        double max = Arrays.stream(peaks).max().orElse(0);
        double top = max > 0 ? max : 1;
        double[] edges = new double[HISTOGRAM_BINS + 1];
        for (int i = 0; i <= HISTOGRAM_BINS; i++) {
            edges[i] = top * i / HISTOGRAM_BINS;
        }
        int[] counts = new int[HISTOGRAM_BINS];
        for (double p : peaks) {
            int k = (int) Math.min(HISTOGRAM_BINS - 1, Math.floor(p / top * HISTOGRAM_BINS));
            counts[Math.max(0, k)]++;
        }
        return new Histogram(edges, counts);
    }
}
