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
import java.util.concurrent.atomic.AtomicInteger;
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
 * are held exact; the key {@value ToleranceOverrides#OPAMP_GBW_KEY} spreads every op-amp's gbwHz, those inside
 * circuit stages included (named as {@link PartsList#opAmps} names them),
 * each op-amp drawn on its own), and computes the band levels 10·log10 ∫|H|² df and their centred
 * deviations from a reference: the target slope's band levels, or with
 * {@link Spec#againstNominal()} the nominal design's own band levels (any shape). Trial i uses its
 * own generator seeded from (seed, i) by a SplitMix64 finaliser, so a result depends on the seed
 * only, never on the thread count.
 *
 * <p>Memory is flat in the trial count: the percentiles come from {@link BinnedQuantiles}
 * (0.001 dB bins, every percentile within {@value BinnedQuantiles#ERROR_DB} dB of the sample
 * percentile of the same trials), workers hand their results over in blocks of
 * {@value #BLOCK_TRIALS} trials, and the yield is an exact count.
 */
public final class MonteCarlo {
    private static final int HISTOGRAM_BINS = 20;
    /** Central-difference step in ln value for the sensitivities: ±1e-3 (0.1 %). */
    private static final double SENSITIVITY_STEP = 1e-3;
    /** Trials a worker computes before adding them to the shared histograms. */
    static final int BLOCK_TRIALS = 1024;
    /** The largest trial count accepted. */
    public static final int MAX_TRIALS = 10_000_000;

    private MonteCarlo() {
    }

    /**
     * The settings.
     *
     * @param trials         number of trials, 1 … {@value #MAX_TRIALS}
     * @param limitDb        the yield limit on the peak band deviation, dB, &gt; 0
     * @param threads        worker threads, ≥ 1
     * @param againstNominal judge each trial against the nominal design's band levels instead of
     *                       the target slope's
     */
    public record Spec(Design design, FrequencyRange range, TargetSlope target, BandFraction fraction, int trials,
            Distribution distribution, long seed, double limitDb, int threads, boolean againstNominal) {
        public Spec {
            Objects.requireNonNull(design, "design");
            Objects.requireNonNull(range, "range");
            Objects.requireNonNull(target, "target");
            Objects.requireNonNull(fraction, "fraction");
            Objects.requireNonNull(distribution, "distribution");
            if (trials < 1 || trials > MAX_TRIALS) {
                throw new IllegalArgumentException("trials=" + trials + " must be 1 to " + MAX_TRIALS);
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
     * @param nominalDeviationDb the nominal design's centred deviation from the reference, dB (0
     *                           in every band when judged against the nominal design)
     * @param levelDb            percentiles of the band level, dB
     * @param deviationDb        percentiles of the centred deviation (each trial centred on its own), dB
     */
    public record BandSpread(Band band, double nominalLevelDb, double nominalDeviationDb, Quantiles levelDb,
            Quantiles deviationDb) {
    }

    /**
     * A part's effect on the band levels.
     *
     * @param designator        the part, or "U" and the stage number for an op-amp's gbwHz
     * @param tolerance         its tolerance, or null when held exact
     * @param levelDbPerPercent per band, the change of the band level for +1 % on the value:
     *                          0.01·∂L/∂ln v, by a central difference, dB
     * @param maxLevelDb        the largest |levelDbPerPercent|
     * @param maxShapeDb        the largest |levelDbPerPercent − its mean over the bands|: the part
     *                          of the effect that centring cannot remove (a change common to all
     *                          bands is only a gain change); the raw sensitivity, dB per 1 %
     * @param contributionDb    maxShapeDb × the tolerance in percent: the shape change, dB, of a
     *                          full-tolerance move of this part alone (0 when held exact); the
     *                          ranking key
     */
    public record PartSensitivity(String designator, Tolerance tolerance, double[] levelDbPerPercent,
            double maxLevelDb, double maxShapeDb, double contributionDb) {
    }

    /**
     * A histogram of the peak band deviation.
     *
     * @param edgesDb bin edges, dB, one more than counts
     * @param counts  trials per bin (the last bin includes its upper edge); built from the
     *                0.001 dB bins of {@link BinnedQuantiles}, so a trial within 0.0005 dB of an
     *                edge may be counted on either side
     */
    public record Histogram(double[] edgesDb, long[] counts) {
    }

    /**
     * The result.
     *
     * @param bands              per band
     * @param peakDb             percentiles of the per-trial peak band deviation (maxBandDeviationDb), dB
     * @param maxPeakDb          the largest per-trial peak band deviation, dB (exact)
     * @param histogram          of the per-trial peaks
     * @param yield              fraction of trials with peak ≤ limit (an exact count)
     * @param yieldStandardError √(y(1 − y)/N), the binomial standard error
     * @param nominalPeakDb      the nominal design's peak band deviation, dB
     * @param toleranced         designators drawn at random (op-amps as "U" and the stage number)
     * @param exact              designators held exact (no tolerance given)
     * @param sensitivities      every part, ranked by {@link PartSensitivity#contributionDb()},
     *                           then by {@link PartSensitivity#maxShapeDb()}, largest first
     */
    public record Result(Spec spec, BandTable table, List<BandSpread> bands, Quantiles peakDb, double maxPeakDb,
            Histogram histogram, double yield, double yieldStandardError, double nominalPeakDb, List<String> toleranced,
            List<String> exact, List<PartSensitivity> sensitivities) {
    }

    /** The shared accumulators; workers add whole blocks under its lock. */
    private static final class Accumulator {
        final BinnedQuantiles[] levels;
        final BinnedQuantiles[] devs;
        final BinnedQuantiles peaks = new BinnedQuantiles(0);
        long pass;

        Accumulator(double[] nomLevels, double[] nomDev) {
            levels = new BinnedQuantiles[nomLevels.length];
            devs = new BinnedQuantiles[nomLevels.length];
            for (int i = 0; i < nomLevels.length; i++) {
                levels[i] = BinnedQuantiles.centredOn(nomLevels[i]);
                devs[i] = BinnedQuantiles.centredOn(nomDev[i]);
            }
        }

        synchronized void add(double[] block, int trials, int nb, double limitDb) {
            int stride = 2 * nb + 1;
            for (int t = 0; t < trials; t++) {
                int o = t * stride;
                for (int i = 0; i < nb; i++) {
                    levels[i].add(block[o + i]);
                    devs[i].add(block[o + nb + i]);
                }
                double p = block[o + 2 * nb];
                peaks.add(p);
                if (p <= limitDb) {
                    pass++;
                }
            }
        }
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
        Tolerance gbwTol = spec.design().tolerances().get(ToleranceOverrides.OPAMP_GBW_KEY);
        // every modelled op-amp, stage by stage (an older-kind stage's single one: k = -1; a circuit
        // stage's: its index in the nodal workspace), named as the parts list names them
        List<String> opName = new ArrayList<>();
        List<int[]> opAt = new ArrayList<>();
        for (PartsList.OpAmpEntry o : PartsList.opAmps(spec.design())) {
            int s = o.stage() - 1;
            int k = program.circuitOpAmpIndex(s, o.name());
            if (k >= 0 || program.hasOpAmp(s)) {
                opName.add(o.name());
                opAt.add(new int[] {s, k});
            }
        }
        double gbwTolFraction = gbwTol == null ? 0 : gbwTol.fraction();
        opName.forEach(name -> (gbwTol == null ? exact : toleranced).add(name));
        int nb = scorer.bandCount();
        int n = spec.trials();
        Scorer.Workspace w = scorer.workspace();
        double[] nomLevels = new double[nb];
        scorer.bandLevels(nominal, w, nomLevels);
        double[] reference = new double[nb];
        for (int i = 0; i < nb; i++) {
            Band b = table.band(i);
            reference[i] = spec.againstNominal() ? nomLevels[i] : 10 * Math.log10(spec.target().bandPower(b.lowHz(), b.highHz()));
        }
        double[] nomDev = new double[nb];
        centred(nomLevels, reference, nomDev, 0);
        Accumulator acc = new Accumulator(nomLevels, nomDev);

        int threads = Math.min(spec.threads(), (n + BLOCK_TRIALS - 1) / BLOCK_TRIALS);
        ExecutorService pool = Executors.newFixedThreadPool(threads, r -> {
            Thread t = new Thread(r, "roseate-montecarlo");
            t.setDaemon(true);
            return t;
        });
        try {
            List<Future<?>> fs = new ArrayList<>();
            AtomicInteger nextBlock = new AtomicInteger();
            AtomicInteger done = new AtomicInteger();
            int blocks = (n + BLOCK_TRIALS - 1) / BLOCK_TRIALS;
            for (int k = 0; k < threads; k++) {
                fs.add(pool.submit(() -> {
                    Scorer.Workspace ws = scorer.workspace();
                    double[] values = new double[nominal.length];
                    double[] raw = new double[nb];
                    int stride = 2 * nb + 1;
                    double[] block = new double[BLOCK_TRIALS * stride];
                    for (int blk = nextBlock.getAndIncrement(); blk < blocks; blk = nextBlock.getAndIncrement()) {
                        int a = blk * BLOCK_TRIALS;
                        int b = Math.min(n, a + BLOCK_TRIALS);
                        for (int trial = a; trial < b; trial++) {
                            SplittableRandom rnd = new SplittableRandom(Fitter.mix(spec.seed(), trial));
                            for (int i = 0; i < values.length; i++) {
                                values[i] = tol[i] == 0 ? nominal[i] : nominal[i] * (1 + tol[i] * draw(spec.distribution(), rnd));
                            }
                            for (int[] at : opAt) {
                                PowerProgram.setGbwFactor(at[0], at[1], gbwTolFraction == 0 ? 1
                                        : 1 + gbwTolFraction * draw(spec.distribution(), rnd), ws.power());
                            }
                            scorer.bandLevels(values, ws, raw);
                            int o = (trial - a) * stride;
                            System.arraycopy(raw, 0, block, o, nb);
                            block[o + 2 * nb] = centred(raw, reference, block, o + nb);
                        }
                        acc.add(block, b - a, nb, spec.limitDb());
                        progress.accept((double) done.addAndGet(b - a) / n);
                    }
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

        List<BandSpread> bands = new ArrayList<>();
        for (int i = 0; i < nb; i++) {
            bands.add(new BandSpread(table.band(i), nomLevels[i], nomDev[i], acc.levels[i].quantiles(), acc.devs[i].quantiles()));
        }
        double y = (double) acc.pass / n;
        List<PartSensitivity> sens = new ArrayList<>();
        for (int i = 0; i < parts.size(); i++) {
            Component c = parts.get(i);
            sens.add(sensitivity(c.designator(), spec.design().toleranceOf(c).orElse(null),
                    bandSensitivity(scorer, w, nominal, i, null)));
        }
        for (int o = 0; o < opAt.size(); o++) {
            sens.add(sensitivity(opName.get(o), gbwTol, bandSensitivity(scorer, w, nominal, -1, opAt.get(o))));
        }
        sens.sort(Comparator.comparingDouble(PartSensitivity::contributionDb)
                .thenComparingDouble(PartSensitivity::maxShapeDb).reversed());
        return new Result(spec, table, bands, acc.peaks.quantiles(), acc.peaks.max(), histogram(acc.peaks), y,
                Math.sqrt(y * (1 - y) / n), Scorer.halfSpread(nomDev, nb), toleranced, exact, sens);
    }

    /**
     * "U" and the 1-based stage number: the name of an older-kind stage's op-amp unless a circuit
     * op-amp's designator takes it (then {@link PartsList#opAmps} names it, as the runs do).
     */
    public static String opAmpName(int stage) {
        return ToleranceOverrides.OPAMP_GBW_KEY + (stage + 1);
    }

    private static PartSensitivity sensitivity(String name, Tolerance t, double[] s) {
        double mean = Arrays.stream(s).average().orElse(0);
        double maxL = 0;
        double maxS = 0;
        for (double v : s) {
            maxL = Math.max(maxL, Math.abs(v));
            maxS = Math.max(maxS, Math.abs(v - mean));
        }
        return new PartSensitivity(name, t, s, maxL, maxS, t == null ? 0 : maxS * t.percent());
    }

    /**
     * Writes levelsDb − reference, centred by the minimax offset, into out[from …] and returns the
     * peak (max − min)/2.
     */
    private static double centred(double[] levelsDb, double[] reference, double[] out, int from) {
        double max = Double.NEGATIVE_INFINITY;
        double min = Double.POSITIVE_INFINITY;
        for (int i = 0; i < levelsDb.length; i++) {
            double d = levelsDb[i] - reference[i];
            out[from + i] = d;
            max = Math.max(max, d);
            min = Math.min(min, d);
        }
        double off = -(max + min) / 2;
        for (int i = 0; i < levelsDb.length; i++) {
            out[from + i] += off;
        }
        return (max - min) / 2;
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

    /**
     * Per band, dB per +1 % of part {@code slot} (or, with slot −1, of the gbwHz of the op-amp at
     * {@code opAt} = {stage, index in the circuit stage or −1}).
     */
    private static double[] bandSensitivity(Scorer scorer, Scorer.Workspace w, double[] nominal, int slot, int[] opAt) {
        int nb = scorer.bandCount();
        double[] up = new double[nb];
        double[] down = new double[nb];
        double[] v = nominal.clone();
        if (slot >= 0) {
            v[slot] = nominal[slot] * Math.exp(SENSITIVITY_STEP);
        } else {
            PowerProgram.setGbwFactor(opAt[0], opAt[1], Math.exp(SENSITIVITY_STEP), w.power());
        }
        scorer.bandLevels(v, w, up);
        if (slot >= 0) {
            v[slot] = nominal[slot] * Math.exp(-SENSITIVITY_STEP);
        } else {
            PowerProgram.setGbwFactor(opAt[0], opAt[1], Math.exp(-SENSITIVITY_STEP), w.power());
        }
        scorer.bandLevels(v, w, down);
        if (slot < 0) {
            PowerProgram.setGbwFactor(opAt[0], opAt[1], 1, w.power());
        }
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

    /** 20 equal bins from 0 to the largest peak, filled from the fine bins by their centres. */
    private static Histogram histogram(BinnedQuantiles peaks) {
        double max = peaks.max();
        double top = max > 0 && Double.isFinite(max) ? max : 1;
        double[] edges = new double[HISTOGRAM_BINS + 1];
        for (int i = 0; i <= HISTOGRAM_BINS; i++) {
            edges[i] = top * i / HISTOGRAM_BINS;
        }
        long[] counts = new long[HISTOGRAM_BINS];
        for (int j = 0; j < BinnedQuantiles.BINS; j++) {
            int c = peaks.binCount(j);
            if (c == 0) {
                continue;
            }
            double centre = peaks.binLowDb(j) + BinnedQuantiles.BIN_DB / 2;
            int k = (int) Math.min(HISTOGRAM_BINS - 1, Math.floor(centre / top * HISTOGRAM_BINS));
            counts[Math.max(0, k)] += c;
        }
        counts[HISTOGRAM_BINS - 1] += peaks.outsideSpan();
        return new Histogram(edges, counts);
    }
}
