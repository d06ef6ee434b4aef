package org.roseate.tools;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.Comparator;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.SplittableRandom;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.atomic.AtomicLong;
import java.util.function.DoubleConsumer;
import org.hipparchus.exception.MathIllegalStateException;
import org.hipparchus.optim.InitialGuess;
import org.hipparchus.optim.MaxEval;
import org.hipparchus.optim.MaxIter;
import org.hipparchus.optim.SimpleBounds;
import org.hipparchus.optim.nonlinear.scalar.GoalType;
import org.hipparchus.optim.nonlinear.scalar.ObjectiveFunction;
import org.hipparchus.optim.nonlinear.scalar.noderiv.CMAESOptimizer;
import org.hipparchus.optim.nonlinear.scalar.noderiv.NelderMeadSimplex;
import org.hipparchus.optim.nonlinear.scalar.noderiv.SimplexOptimizer;
import org.hipparchus.random.MersenneTwister;
import org.roseate.bands.BandTable;
import org.roseate.circuit.Component;
import org.roseate.circuit.Design;
import org.roseate.compare.DesignAnalysis;
import org.roseate.compare.LogGrid;
import org.roseate.model.CircuitModel;
import org.roseate.tools.FitResult.ClampedValue;
import org.roseate.tools.FitResult.FitScore;
import org.roseate.value.ComponentKind;
import org.roseate.value.ESeries;

/**
 * Fits component values so a design follows a target slope: minimises J = (band peak deviation)
 * + w·(pointwise peak deviation) + {@value #GAIN_WEIGHT}·|gain error|, the first two centred
 * minimax measures in dB (see {@link FitSpec}), the last the distance in dB of 20·log10|H| at the
 * held frequency from the held gain (only when {@link FitSpec#gain()} holds one). Only the parts
 * named free move; every other part keeps its value bit for bit. A free part whose starting value
 * lies outside the limits starts at the nearest limit and is reported in
 * {@link FitResult#clamped()}.
 *
 * <ol>
 *   <li>Continuous: from {@link FitSpec#starts()} starts in ln-value space (start 0 the design's
 *       own values, the others log-normal perturbations of it, σ = 0.7 neper), CMA-ES (Hansen's
 *       covariance-matrix adaptation, Hipparchus 4.0.2) on J within the limits, then a
 *       Nelder–Mead polish. CMA-ES needs no gradient, so the kinks of a minimax objective do not
 *       stall it. Starts run in parallel; each has its own seed derived from (seed, start).</li>
 *   <li>Discrete: each free part may take the standard values within two steps of its continuous
 *       value (inside the limits). From plain rounding, and from seeded random picks, a local
 *       search moves one part, then two parts at once, to any of their candidates while J
 *       falls. The best three continuous optima are each searched this way.</li>
 *   <li>The two answers are analysed again independently through
 *       {@link CircuitModel} and {@link DesignAnalysis}.</li>
 * </ol>
 * Results depend on the seed only, not on the thread count.
 */
public final class Fitter {
    /**
     * Weight of the gain error in J on continuous values, per dB. A centred deviation does not see
     * the overall gain, so the continuous optimum meets the held gain exactly at no cost in shape.
     */
    public static final double GAIN_WEIGHT = 1.0;
    /**
     * On standard values the overall scale moves in E-series steps (one E24 step is 0.83 dB), so
     * an exact gain would cost shape: the discrete search lets the gain err by up to this much at
     * no cost, dB (a quarter of an E24 step, rounded).
     */
    public static final double STANDARD_GAIN_SLACK_DB = 0.2;
    /** Weight per dB of the gain error beyond {@link #STANDARD_GAIN_SLACK_DB} on standard values: steep, a near-hard limit. */
    public static final double STANDARD_GAIN_WEIGHT = 10.0;
    private static final double START_SIGMA_NEPER = 0.7;
    private static final double CMA_SIGMA_NEPER = 0.3;
    private static final int CMA_EVALUATIONS_PER_PARAMETER = 500;
    private static final int POLISH_EVALUATIONS_PER_PARAMETER = 200;
    private static final int CANDIDATE_STEPS = 2;
    private static final int DISCRETE_RESTARTS = 3;
    private static final int TOP_OPTIMA = 3;

    private final FitSpec spec;
    private final Scorer scorer;
    private final int[] slots;
    private final double[] lnLo;
    private final double[] lnHi;
    private final ESeries[] seriesOf;
    private final double[] base;
    private final List<ClampedValue> clamped = new ArrayList<>();
    private final double gainOmega;
    private final AtomicLong evaluations = new AtomicLong();

    private Fitter(FitSpec spec) {
        this.spec = spec;
        PowerProgram program = PowerProgram.of(spec.start());
        this.scorer = new Scorer(program, spec.range(), spec.target(),
                BandTable.of(spec.fraction(), spec.range().loHz(), spec.range().hiHz()), spec.sourceShape());
        int n = spec.free().size();
        slots = new int[n];
        lnLo = new double[n];
        lnHi = new double[n];
        seriesOf = new ESeries[n];
        for (int i = 0; i < n; i++) {
            slots[i] = program.slot(spec.free().get(i));
            ComponentKind kind = program.parts().get(slots[i]).kind();
            lnLo[i] = Math.log(spec.limits().min(kind));
            lnHi[i] = Math.log(spec.limits().max(kind));
            seriesOf[i] = spec.series().of(kind);
        }
        base = program.nominal();
        for (int i = 0; i < n; i++) {
            double lo = Math.exp(lnLo[i]);
            double hi = Math.exp(lnHi[i]);
            double v = base[slots[i]];
            if (v < lo || v > hi) {
                double to = v < lo ? spec.limits().min(program.parts().get(slots[i]).kind())
                        : spec.limits().max(program.parts().get(slots[i]).kind());
                clamped.add(new ClampedValue(spec.free().get(i), v, to));
                base[slots[i]] = to;
            }
        }
        gainOmega = 2 * Math.PI * spec.gain().map(GainHold::atHz).orElse(1000.0);
    }

    /**
     * Runs the fit.
     *
     * @param progress receives the fraction done, 0 … 1, from worker threads (must be thread-safe)
     */
    public static FitResult fit(FitSpec spec, DoubleConsumer progress) {
        return new Fitter(spec).run(progress);
    }

    /** One continuous or discrete candidate: free values (Ω, F) and J. */
    private record Candidate(double[] free, double objective) {
    }

    private FitResult run(DoubleConsumer progress) {
        long t0 = System.nanoTime();
        int n = slots.length;
        long budget = (long) spec.starts() * n * (CMA_EVALUATIONS_PER_PARAMETER + POLISH_EVALUATIONS_PER_PARAMETER);
        ExecutorService pool = Executors.newFixedThreadPool(spec.threads(), r -> {
            Thread t = new Thread(r, "roseate-fit");
            t.setDaemon(true);
            return t;
        });
        try {
            List<Future<Candidate>> futures = new ArrayList<>();
            for (int s = 0; s < spec.starts(); s++) {
                final int start = s;
                futures.add(pool.submit(() -> continuous(start, budget, progress)));
            }
            List<Candidate> optima = collect(futures);
            optima.sort(Comparator.comparingDouble(Candidate::objective));
            Candidate bestContinuous = optima.get(0);

            List<Future<Candidate>> discrete = new ArrayList<>();
            int tops = Math.min(TOP_OPTIMA, optima.size());
            int jobs = tops * (DISCRETE_RESTARTS + 1);
            AtomicLong doneJobs = new AtomicLong();
            for (int k = 0; k < tops; k++) {
                Candidate c = optima.get(k);
                for (int r = 0; r <= DISCRETE_RESTARTS; r++) {
                    final int restart = r;
                    final int origin = k;
                    discrete.add(pool.submit(() -> {
                        Candidate d = discrete(c.free(), restart, origin);
                        progress.accept(0.85 + 0.15 * doneJobs.incrementAndGet() / jobs);
                        return d;
                    }));
                }
            }
            List<Candidate> snaps = collect(discrete);
            snaps.sort(Comparator.comparingDouble(Candidate::objective));
            Candidate bestSnapped = snaps.get(0);

            Design continuousDesign = design(bestContinuous.free());
            Design snappedDesign = design(bestSnapped.free());
            progress.accept(1);
            List<String> atLimit = new ArrayList<>();
            for (int i = 0; i < n; i++) {
                double v = bestSnapped.free()[i];
                if (v <= Math.exp(lnLo[i]) * (1 + ESeries.RELATIVE_SLACK) || v >= Math.exp(lnHi[i]) * (1 - ESeries.RELATIVE_SLACK)) {
                    atLimit.add(spec.free().get(i));
                }
            }
            return new FitResult(continuousDesign, snappedDesign, score(continuousDesign, false), score(snappedDesign, true),
                    analyse(continuousDesign), analyse(snappedDesign), spec.gain(), gainDb(spec.start()),
                    gainDb(continuousDesign), gainDb(snappedDesign), clamped, atLimit, evaluations.get(),
                    (System.nanoTime() - t0) / 1e9);
        } finally {
            pool.shutdownNow();
        }
    }

    private static <T> List<T> collect(List<Future<T>> futures) {
        List<T> out = new ArrayList<>();
        try {
            for (Future<T> f : futures) {
                out.add(f.get());
            }
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IllegalStateException("fit interrupted", e);
        } catch (ExecutionException e) {
            Throwable c = e.getCause();
            if (c instanceof RuntimeException re) {
                throw re;
            }
            throw new IllegalStateException(c);
        }
        return out;
    }

    /** The objective on ln values, with the best point seen kept (CMA-ES may stop by exception). */
    private final class Objective {
        final Scorer.Workspace w = scorer.workspace();
        final double[] values = base.clone();
        final long budget;
        final DoubleConsumer progress;
        double bestJ = Double.POSITIVE_INFINITY;
        double[] bestLn;

        Objective(long budget, DoubleConsumer progress) {
            this.budget = budget;
            this.progress = progress;
        }

        double value(double[] ln) {
            double penalty = 0;
            for (int i = 0; i < ln.length; i++) {
                double x = Math.max(lnLo[i], Math.min(lnHi[i], ln[i]));
                penalty += (x - ln[i]) * (x - ln[i]);
                values[slots[i]] = Math.exp(x);
            }
            double j = objective(values, w) + 10 * penalty;
            if (j < bestJ) {
                bestJ = j;
                bestLn = ln.clone();
            }
            long e = evaluations.incrementAndGet();
            if ((e & 1023) == 0) {
                progress.accept(Math.min(0.85, 0.85 * e / budget));
            }
            return j;
        }
    }

    private double objective(double[] values, Scorer.Workspace w) {
        return objective(values, w, false);
    }

    /** J on continuous values, or with {@code standard} the discrete search's J (gain slack). */
    private double objective(double[] values, Scorer.Workspace w, boolean standard) {
        double band = scorer.bandPeakDb(values, w);
        double j = band;
        if (spec.gain().isPresent()) {
            double e = Math.abs(gainErrorDb(w));
            j += standard ? STANDARD_GAIN_WEIGHT * Math.max(0, e - STANDARD_GAIN_SLACK_DB) : GAIN_WEIGHT * e;
        }
        return spec.pointwiseWeight() == 0 ? j : j + spec.pointwiseWeight() * scorer.pointPeakDb(values, w);
    }

    /** 20·log10|H| at the held frequency minus the held gain, for the values last loaded into w. */
    private double gainErrorDb(Scorer.Workspace w) {
        double db = 10 * Math.log10(scorer.program().power(gainOmega, w.power()));
        return db - spec.gain().map(GainHold::gainDb).orElse(0.0);
    }

    private Candidate continuous(int start, long budget, DoubleConsumer progress) {
        int n = slots.length;
        SplittableRandom rnd = new SplittableRandom(mix(spec.seed(), start));
        double[] x0 = new double[n];
        for (int i = 0; i < n; i++) {
            double x = Math.log(base[slots[i]]);
            if (start > 0) {
                x += START_SIGMA_NEPER * gaussian(rnd);
            }
            x0[i] = Math.max(lnLo[i] + 1e-9, Math.min(lnHi[i] - 1e-9, x));
        }
        Objective f = new Objective(budget, progress);
        double[] sigma = new double[n];
        Arrays.fill(sigma, CMA_SIGMA_NEPER);
        CMAESOptimizer cma = new CMAESOptimizer(100_000, 0, true, 0, 0, new MersenneTwister(rnd.nextLong()), false, null);
        try {
            cma.optimize(new MaxEval(n * CMA_EVALUATIONS_PER_PARAMETER), new ObjectiveFunction(f::value),
                    GoalType.MINIMIZE, new InitialGuess(x0), new SimpleBounds(lnLo, lnHi),
                    new CMAESOptimizer.Sigma(sigma), new CMAESOptimizer.PopulationSize(4 + (int) (3 * Math.log(n)) + 4));
        } catch (MathIllegalStateException e) {
            // evaluation or iteration budget spent: the best point seen is kept by the objective
        }
        SimplexOptimizer nm = new SimplexOptimizer(1e-12, 1e-14);
        double[] steps = new double[n];
        Arrays.fill(steps, 0.03);
        try {
            nm.optimize(new MaxEval(n * POLISH_EVALUATIONS_PER_PARAMETER), new MaxIter(Integer.MAX_VALUE),
                    new ObjectiveFunction(f::value), GoalType.MINIMIZE, new InitialGuess(f.bestLn.clone()),
                    new NelderMeadSimplex(steps));
        } catch (MathIllegalStateException e) {
            // as above
        }
        double[] free = new double[n];
        for (int i = 0; i < n; i++) {
            free[i] = Math.exp(Math.max(lnLo[i], Math.min(lnHi[i], f.bestLn[i])));
        }
        return new Candidate(free, f.bestJ);
    }

    /** Local search over the standard values near a continuous optimum. */
    private Candidate discrete(double[] continuous, int restart, int origin) {
        int n = slots.length;
        double[][] cand = new double[n][];
        int[] centre = new int[n];
        for (int i = 0; i < n; i++) {
            double[] allowed = seriesOf[i].valuesBetween(Math.exp(lnLo[i]), Math.exp(lnHi[i]));
            if (allowed.length == 0) {
                throw new IllegalArgumentException("no " + seriesOf[i] + " value lies within the limits of "
                        + spec.free().get(i) + " (" + spec.limits() + ")");
            }
            int k = nearestIndex(allowed, continuous[i]);
            int from = Math.max(0, k - CANDIDATE_STEPS);
            int to = Math.min(allowed.length - 1, k + CANDIDATE_STEPS);
            cand[i] = Arrays.copyOfRange(allowed, from, to + 1);
            centre[i] = k - from;
        }
        SplittableRandom rnd = new SplittableRandom(mix(spec.seed() ^ 0x5DEECE66DL, 1000L * origin + restart));
        int[] pick = centre.clone();
        if (restart > 0) {
            for (int i = 0; i < n; i++) {
                pick[i] = Math.max(0, Math.min(cand[i].length - 1, centre[i] + rnd.nextInt(3) - 1));
            }
        }
        Scorer.Workspace w = scorer.workspace();
        double[] values = base.clone();
        for (int i = 0; i < n; i++) {
            values[slots[i]] = cand[i][pick[i]];
        }
        double best = objective(values, w, true);
        boolean improved = true;
        while (improved) {
            improved = false;
            for (int i = 0; i < n; i++) {
                for (int a = 0; a < cand[i].length; a++) {
                    if (a == pick[i]) {
                        continue;
                    }
                    values[slots[i]] = cand[i][a];
                    double j = objective(values, w, true);
                    evaluations.incrementAndGet();
                    if (j < best - 1e-12) {
                        best = j;
                        pick[i] = a;
                        improved = true;
                    } else {
                        values[slots[i]] = cand[i][pick[i]];
                    }
                }
            }
            if (improved) {
                continue;
            }
            for (int i = 0; i < n && !improved; i++) {
                for (int k = i + 1; k < n && !improved; k++) {
                    for (int a = 0; a < cand[i].length && !improved; a++) {
                        for (int b = 0; b < cand[k].length; b++) {
                            if (a == pick[i] && b == pick[k]) {
                                continue;
                            }
                            values[slots[i]] = cand[i][a];
                            values[slots[k]] = cand[k][b];
                            double j = objective(values, w, true);
                            evaluations.incrementAndGet();
                            if (j < best - 1e-12) {
                                best = j;
                                pick[i] = a;
                                pick[k] = b;
                                improved = true;
                                break;
                            }
                        }
                        if (!improved) {
                            values[slots[i]] = cand[i][pick[i]];
                            values[slots[k]] = cand[k][pick[k]];
                        }
                    }
                }
            }
        }
        double[] free = new double[n];
        for (int i = 0; i < n; i++) {
            free[i] = cand[i][pick[i]];
        }
        return new Candidate(free, best);
    }

    private static int nearestIndex(double[] sorted, double v) {
        int best = 0;
        for (int k = 1; k < sorted.length; k++) {
            if (Math.abs(Math.log(sorted[k] / v)) < Math.abs(Math.log(sorted[best] / v))) {
                best = k;
            }
        }
        return best;
    }

    /** The start design with the free values replaced; held parts keep their values exactly. */
    private Design design(double[] free) {
        Map<String, Double> values = new HashMap<>();
        for (int i = 0; i < free.length; i++) {
            values.put(spec.free().get(i), free[i]);
        }
        return spec.start().withValues(values);
    }

    /** 20·log10|H| at the held frequency (1 kHz when none is held), through the exact model. */
    private double gainDb(Design d) {
        return 20 * Math.log10(CircuitModel.of(d, d.name()).response(gainOmega / (2 * Math.PI)).abs());
    }

    private FitScore score(Design d, boolean standard) {
        PowerProgram p = PowerProgram.of(d);
        Scorer s = new Scorer(p, spec.range(), spec.target(), scorer.table(), spec.sourceShape());
        Scorer.Workspace w = s.workspace();
        double[] v = p.nominal();
        double band = s.bandPeakDb(v, w);
        double gainError = 0;
        if (spec.gain().isPresent()) {
            double db = 10 * Math.log10(p.power(gainOmega, w.power()));
            gainError = db - spec.gain().get().gainDb();
        }
        double point = s.pointPeakDb(v, w);
        double gainCost = standard ? STANDARD_GAIN_WEIGHT * Math.max(0, Math.abs(gainError) - STANDARD_GAIN_SLACK_DB)
                : GAIN_WEIGHT * Math.abs(gainError);
        return new FitScore(band, point, gainError, band + spec.pointwiseWeight() * point + gainCost);
    }

    private DesignAnalysis analyse(Design d) {
        CircuitModel m = CircuitModel.of(d, d.name());
        double[] hz = LogGrid.points(spec.range().loHz(), spec.range().hiHz(), 20);
        return spec.source().isPresent()
                ? DesignAnalysis.withSource(m, spec.range(), spec.target(), spec.fraction(), hz, spec.sourceShape())
                : DesignAnalysis.of(m, spec.range(), spec.target(), spec.fraction(), hz);
    }

    /** SplitMix64 finaliser of (seed, stream): independent, reproducible seeds per task. */
    static long mix(long seed, long stream) {
        long z = seed + 0x9E3779B97F4A7C15L * (stream + 1);
        z = (z ^ (z >>> 30)) * 0xBF58476D1CE4E5B9L;
        z = (z ^ (z >>> 27)) * 0x94D049BB133111EBL;
        return z ^ (z >>> 31);
    }

    /** A standard normal deviate by the polar method (Marsaglia). */
    static double gaussian(SplittableRandom r) {
        while (true) {
            double u = 2 * r.nextDouble() - 1;
            double v = 2 * r.nextDouble() - 1;
            double s = u * u + v * v;
            if (s > 0 && s < 1) {
                return u * Math.sqrt(-2 * Math.log(s) / s);
            }
        }
    }
}
