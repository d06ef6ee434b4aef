package org.roseate.diagnose;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.hipparchus.distribution.continuous.ChiSquaredDistribution;
import org.hipparchus.exception.MathIllegalStateException;
import org.hipparchus.distribution.continuous.NormalDistribution;
import org.hipparchus.linear.Array2DRowRealMatrix;
import org.hipparchus.linear.ArrayRealVector;
import org.hipparchus.linear.EigenDecompositionSymmetric;
import org.hipparchus.linear.RealMatrix;
import org.hipparchus.linear.RealVector;
import org.hipparchus.optim.nonlinear.vector.leastsquares.LeastSquaresBuilder;
import org.hipparchus.optim.nonlinear.vector.leastsquares.LeastSquaresOptimizer;
import org.hipparchus.optim.nonlinear.vector.leastsquares.LeastSquaresProblem;
import org.hipparchus.optim.nonlinear.vector.leastsquares.LevenbergMarquardtOptimizer;
import org.hipparchus.util.Pair;
import org.roseate.circuit.Design;

/**
 * Estimates every part's actual value from a measured response: maximum a posteriori estimation
 * over θ_j = ln(value_j/nominal_j).
 *
 * <p>The cost is Σ_i ((L_i(θ) + g − m_i)/u_i)² + Σ_i (wrap(φ_i − Φ_i(θ))/v_i)² + Σ_j c_j(θ_j),
 * where m_i is the measured level in dB with standard uncertainty u_i (trusted points only), φ_i the
 * measured phase in degrees with standard uncertainty v_i (transfer captures; noise sources have
 * none), Φ_i the model's arg H, wrap(·) to ±180°, L_i the model's 20·log10|H|, g a free
 * level offset in dB for noise-source captures (0 otherwise, with no prior), and c_j the prior's
 * cost −2·ln(p_j(θ)/p_j(0)) from the part's tolerance ({@link PartPrior}: a normal core with the
 * tolerance at ±2σ, plus a broad component for a wrong part), entered as the residual
 * sign(θ)·√c. With normal errors on the dB levels this is −2·ln of the posterior up to a constant. It is minimised by Levenberg–Marquardt
 * (Hipparchus 4.0.2) from the nominal values, with a forward-difference Jacobian.
 *
 * Magnitude and phase enter as separate residuals with their own uncertainties: for a transfer
 * estimate their random errors are uncorrelated to first order (Bendat and Piersol, Random Data,
 * 4th ed., sec. 9.2, from memory), which is what makes this a complex residual in polar form.
 *
 * <p>Uncertainty: the posterior covariance is taken as C = (JᵀWJ + P)⁻¹ at the optimum (Laplace
 * approximation), J the Jacobian of the levels and phases, W = diag(1/u², 1/v²), P the prior's information at the
 * estimate (1/σ² near the nominal). A part's credible
 * interval is exp(θ̂ ± z·√C_jj)·nominal with z the two-sided normal quantile of the confidence; its
 * probability of lying outside nominal·(1 ± t) is the normal mass outside [ln(1 − t), ln(1 + t)].
 *
 * <p>Ambiguity groups: the data-only Fisher information F = JᵀWJ (with the level offset profiled out
 * when it is free) is compared with the prior precision P in the generalised eigenproblem
 * F·v = λ·P·v, P = diag(1/σ²) of the tolerance. Directions with λ &lt; 1 are those along which the capture narrows the value less
 * than the tolerance already does; structural ambiguities (for an inverting stage, all resistors up
 * by k and all capacitors down by k) have λ ≈ 0. The span of those directions, in ln(value)
 * coordinates, is orthonormalised into a projector Π; parts with Π_jj ≥ {@link #GROUP_SHARE} form
 * groups by connecting parts whose correlation |Π_ij|/√(Π_ii·Π_jj) is at least
 * {@link #GROUP_LINK}.
 *
 * <p>Misfit: χ² over levels and phases with ν = N − tr(F·C) degrees of freedom, N the levels plus phases (the effective
 * number of parameters of a regularised least-squares fit); its upper-tail p-value below
 * {@link Diagnosis#MISFIT_P_VALUE} means no part values explain the measurement.
 */
public final class Diagnoser {
    /** Default confidence for intervals and flags: 0.95 (common practice). */
    public static final double DEFAULT_CONFIDENCE = 0.95;
    /** Fewest trusted points that can carry a diagnosis: 8, a handful per decade over most designs' span (common practice). */
    public static final int MIN_TRUSTED_POINTS = 8;
    /** A part belongs to an ambiguity group when at least this share of its axis lies in the unresolved span. */
    static final double GROUP_SHARE = 0.02;
    /** Two parts of the unresolved span share a group when their correlation in it is at least this. */
    static final double GROUP_LINK = 0.3;
    /** Values may move at most a factor e^±4.6 ≈ 100 from nominal during the search. */
    private static final double MAX_LN_RATIO = Math.log(100);
    private static final int MAX_ITERATIONS = 500;
    private static final int MAX_EVALUATIONS = 50 * MAX_ITERATIONS;
    /** Rounds of the wrong-part search: up to three parts released beyond their core prior. */
    private static final int MAX_RELEASE_ROUNDS = 3;
    /** A release is tried only if the data move the part more than this many core σ. */
    private static final double RELEASE_SIGMAS = 3;
    /** Grid of the one-part line search: ln-ratios from 1/10 to 10 in this many steps. */
    private static final int RELEASE_GRID = 47;

    private Diagnoser() {
    }

    /**
     * Diagnoses a build.
     *
     * @param design     the design as drawn
     * @param source     the design's name for error messages
     * @param priors     one prior per part to estimate (usually {@link PartPrior#of})
     * @param measured   the measured response
     * @param confidence for intervals and flags, in (0.5, 1)
     * @throws DiagnosisException if fewer than {@link #MIN_TRUSTED_POINTS} points are trusted
     */
    public static Diagnosis diagnose(Design design, String source, List<PartPrior> priors, MeasuredResponse measured,
            double confidence) {
        if (!(confidence > 0.5 && confidence < 1)) {
            throw new IllegalArgumentException("confidence=" + confidence + " must be in (0.5, 1)");
        }
        if (priors.isEmpty()) {
            throw new IllegalArgumentException("no parts to estimate");
        }
        int[] used = trustedIndices(measured);
        if (used.length < MIN_TRUSTED_POINTS) {
            throw new DiagnosisException(Numbers.of("only %d of %d points are trusted; a diagnosis needs at least %d",
                    used.length, measured.size(), MIN_TRUSTED_POINTS));
        }
        double[] hzAll = measured.hz();
        double[] mAll = measured.measuredDb();
        double[] uAll = measured.uncertaintyDb();
        double[] degAll = measured.measuredDeg();
        double[] uDegAll = measured.uncertaintyDeg();
        int n = used.length;
        int p = priors.size();
        boolean free = measured.levelFree();
        int q = p + (free ? 1 : 0);
        double[] hz = new double[n];
        double[] m = new double[n];
        double[] u = new double[n];
        int[] phaseAt = new int[n];
        int nph = 0;
        for (int k = 0; k < n; k++) {
            hz[k] = hzAll[used[k]];
            m[k] = mAll[used[k]];
            u[k] = uAll[used[k]];
            if (Double.isFinite(degAll[used[k]])) {
                phaseAt[nph++] = k;
            }
        }
        phaseAt = Arrays.copyOf(phaseAt, nph);
        double[] mDeg = new double[nph];
        double[] uDeg = new double[nph];
        for (int r = 0; r < nph; r++) {
            mDeg[r] = degAll[used[phaseAt[r]]];
            uDeg[r] = uDegAll[used[phaseAt[r]]];
        }
        double[] sigma = priors.stream().mapToDouble(PartPrior::sigmaLn).toArray();
        LogMagnitudeModel model = new LogMagnitudeModel(design, source, priors, hz, measured.binHz(), free);

        Solver solver = new Solver(model, priors, m, u, phaseAt, mDeg, uDeg, free);
        Solver.Fit best = solver.fit(new double[p]);
        int iterations = best.iterations();
        // The prior is not convex (a narrow core and a broad wrong-part component), so a search from
        // the nominal values can stop with a wrong part held near its nominal and the others bent to
        // compensate. Try releasing one part at a time to where the data alone would put it, keep the
        // release that lowers the posterior cost most, and repeat (a greedy search over wrong parts).
        for (int round = 0; round < MAX_RELEASE_ROUNDS; round++) {
            Solver.Fit improved = null;
            // Release from the best fit so far, and (first round) from the nominal values, which a
            // fit that bent the wrong parts may have left behind.
            List<double[]> bases = round == 0 ? List.of(best.point(), new double[p]) : List.of(best.point());
            for (double[] base : bases) {
                for (int j = 0; j < p; j++) {
                    double[] s0 = Arrays.copyOf(base, p);
                    s0[j] = solver.bestAlong(j, s0);
                    if (Math.abs(s0[j] - base[j]) < RELEASE_SIGMAS * sigma[j]) {
                        continue;
                    }
                    Solver.Fit f;
                    try {
                        f = solver.fit(s0);
                    } catch (MathIllegalStateException e) {
                        continue; // a start that does not converge in the allowed iterations is no candidate
                    }
                    iterations += f.iterations();
                    if (f.cost() < (improved == null ? best.cost() : improved.cost()) - 1e-9) {
                        improved = f;
                    }
                }
            }
            if (improved == null) {
                break;
            }
            best = improved;
        }
        double[] x = best.point();
        double[] theta = Arrays.copyOf(x, p);
        double g = free ? x[p] : 0;
        double[] db = new double[n];
        double[][] jac = new double[n][p];
        double[] deg = nph > 0 ? new double[n] : null;
        double[][] jacDeg = nph > 0 ? new double[n][p] : null;

        // Information matrices at the optimum (whitened Jacobian rows of the data only: levels, then phases).
        model.responseAndJacobian(theta, db, jac, deg, jacDeg);
        double[][] fisher = new double[q][q];
        for (int k = 0; k < n; k++) {
            double w = 1 / (u[k] * u[k]);
            for (int a = 0; a < q; a++) {
                double ja = a < p ? jac[k][a] : 1;
                for (int b = 0; b <= a; b++) {
                    double jb = b < p ? jac[k][b] : 1;
                    fisher[a][b] += w * ja * jb;
                }
            }
        }
        for (int r = 0; r < nph; r++) {
            int k = phaseAt[r];
            double w = 1 / (uDeg[r] * uDeg[r]);
            for (int a = 0; a < p; a++) {
                for (int b = 0; b <= a; b++) {
                    fisher[a][b] += w * jacDeg[k][a] * jacDeg[k][b];
                }
            }
        }
        for (int a = 0; a < q; a++) {
            for (int b = a + 1; b < q; b++) {
                fisher[a][b] = fisher[b][a];
            }
        }
        double[][] posteriorInfo = new double[q][q];
        for (int a = 0; a < q; a++) {
            posteriorInfo[a] = fisher[a].clone();
            if (a < p) {
                posteriorInfo[a][a] += priors.get(a).precisionAt(theta[a]);
            }
        }
        RealMatrix cov = inverse(new Array2DRowRealMatrix(posteriorInfo, false));

        double z = new NormalDistribution(0, 1).inverseCumulativeProbability(0.5 + confidence / 2);
        List<PartEstimate> parts = new ArrayList<>();
        for (int j = 0; j < p; j++) {
            PartPrior pr = priors.get(j);
            double s = Math.sqrt(Math.max(0, cov.getEntry(j, j)));
            double outside = probabilityOutside(theta[j], s, pr.lowLimitLn(), pr.highLimitLn());
            parts.add(new PartEstimate(pr.designator(), pr.nominal(), pr.tolerance(), pr.nominal() * Math.exp(theta[j]),
                    pr.nominal() * Math.exp(theta[j] - z * s), pr.nominal() * Math.exp(theta[j] + z * s), outside,
                    outside >= confidence));
        }

        // Residuals over all points (untrusted ones shown, not counted).
        LogMagnitudeModel all = new LogMagnitudeModel(design, source, priors, hzAll, measured.binHz(), free);
        double[] fitted = new double[hzAll.length];
        double[] fittedDeg = new double[hzAll.length];
        all.response(theta, fitted, fittedDeg);
        double[] nominalDb = new double[hzAll.length];
        double[] nominalDeg = new double[hzAll.length];
        all.response(new double[p], nominalDb, nominalDeg);
        double designOffset = 0;
        if (free) {
            double[] nomUsed = new double[n];
            for (int k = 0; k < n; k++) {
                nomUsed[k] = nominalDb[used[k]];
            }
            designOffset = weightedOffset(m, nomUsed, u);
        }
        boolean[] trusted = measured.trusted();
        List<FitPoint> points = new ArrayList<>();
        double chi2 = 0;
        double ss = 0;
        double uu = 0;
        double ssDeg = 0;
        for (int i = 0; i < hzAll.length; i++) {
            double f = fitted[i] + g;
            boolean phase = Double.isFinite(degAll[i]);
            points.add(new FitPoint(hzAll[i], mAll[i], f, nominalDb[i] + designOffset, uAll[i], trusted[i],
                    degAll[i], phase ? fittedDeg[i] : Double.NaN, phase ? nominalDeg[i] : Double.NaN, uDegAll[i]));
            if (trusted[i]) {
                double r = mAll[i] - f;
                chi2 += r * r / (uAll[i] * uAll[i]);
                ss += r * r;
                uu += uAll[i] * uAll[i];
                if (phase) {
                    double rd = LogMagnitudeModel.wrapDeg(degAll[i] - fittedDeg[i]);
                    chi2 += rd * rd / (uDegAll[i] * uDegAll[i]);
                    ssDeg += rd * rd;
                }
            }
        }
        double effectiveParameters = 0;
        for (int a = 0; a < q; a++) {
            for (int b = 0; b < q; b++) {
                effectiveParameters += fisher[a][b] * cov.getEntry(b, a);
            }
        }
        double dof = Math.max(1, n + nph - effectiveParameters);
        double pValue = 1 - new ChiSquaredDistribution(dof).cumulativeProbability(chi2);

        List<List<String>> groups = ambiguityGroups(priors, fisher, sigma, free);
        return new Diagnosis(parts, groups, Math.sqrt(ss / n), nph > 0 ? Math.sqrt(ssDeg / nph) : Double.NaN, nph,
                Math.sqrt(uu / n), chi2, dof, pValue, free ? g : Double.NaN, points, confidence, iterations);
    }

    /** One Levenberg–Marquardt problem over (θ, g), reused from several starting points. */
    private static final class Solver {
        record Fit(double[] point, double cost, int iterations) {
        }

        private final LogMagnitudeModel model;
        private final List<PartPrior> priors;
        private final double[] m;
        private final double[] u;
        private final int[] phaseAt;
        private final double[] mDeg;
        private final double[] uDeg;
        private final boolean free;
        private final int n;
        private final int nph;
        private final int p;
        private final double[] target;

        /**
         * @param phaseAt indices into m of the points with a measured phase
         * @param mDeg    their measured phases, degrees
         * @param uDeg    their standard uncertainties, degrees
         */
        Solver(LogMagnitudeModel model, List<PartPrior> priors, double[] m, double[] u, int[] phaseAt, double[] mDeg,
                double[] uDeg, boolean free) {
            this.model = model;
            this.priors = priors;
            this.m = m;
            this.u = u;
            this.phaseAt = phaseAt;
            this.mDeg = mDeg;
            this.uDeg = uDeg;
            this.free = free;
            this.n = m.length;
            this.nph = phaseAt.length;
            this.p = priors.size();
            this.target = new double[n + nph + p];
            for (int k = 0; k < n; k++) {
                target[k] = m[k] / u[k];
            }
            for (int r = 0; r < nph; r++) {
                target[n + r] = mDeg[r] / uDeg[r];
            }
        }

        /** Posterior cost −2·ln p (up to a constant) at θ, the level offset profiled out when free. */
        double cost(double[] theta, double[] db, double[] deg) {
            model.response(theta, db, deg);
            double g = free ? weightedOffset(m, db, u) : 0;
            double c = 0;
            for (int k = 0; k < n; k++) {
                double r = (m[k] - db[k] - g) / u[k];
                c += r * r;
            }
            for (int r = 0; r < nph; r++) {
                double d = LogMagnitudeModel.wrapDeg(mDeg[r] - deg[phaseAt[r]]) / uDeg[r];
                c += d * d;
            }
            for (int j = 0; j < p; j++) {
                c += priors.get(j).cost(theta[j]);
            }
            return c;
        }

        /** The ln-ratio of part j, others held, with the lowest posterior cost on a grid 1/10 … 10. */
        double bestAlong(int j, double[] start) {
            double[] t = Arrays.copyOf(start, p);
            double[] db = new double[n];
            double[] deg = nph > 0 ? new double[n] : null;
            double bestTheta = t[j];
            double best = cost(t, db, deg);
            double span = Math.log(10);
            for (int i = 0; i < RELEASE_GRID; i++) {
                t[j] = -span + 2 * span * i / (RELEASE_GRID - 1);
                double c = cost(t, db, deg);
                if (c < best) {
                    best = c;
                    bestTheta = t[j];
                }
            }
            return bestTheta;
        }

        Fit fit(double[] start) {
            int q = p + (free ? 1 : 0);
            double[] s0 = Arrays.copyOf(start, q);
            if (free) {
                double[] d0 = new double[n];
                model.db(Arrays.copyOf(start, p), d0);
                s0[p] = weightedOffset(m, d0, u);
            }
            double[] db = new double[n];
            double[][] jac = new double[n][p];
            double[] deg = nph > 0 ? new double[n] : null;
            double[][] jacDeg = nph > 0 ? new double[n][p] : null;
            int rows = n + nph + p;
            LeastSquaresProblem problem = new LeastSquaresBuilder()
                    .start(s0)
                    .target(target)
                    .model(point -> {
                        double[] x = point.toArray();
                        model.responseAndJacobian(Arrays.copyOf(x, p), db, jac, deg, jacDeg);
                        double g = free ? x[p] : 0;
                        double[] v = new double[rows];
                        double[][] j = new double[rows][q];
                        for (int k = 0; k < n; k++) {
                            v[k] = (db[k] + g) / u[k];
                            for (int c = 0; c < p; c++) {
                                j[k][c] = jac[k][c] / u[k];
                            }
                            if (free) {
                                j[k][p] = 1 / u[k];
                            }
                        }
                        // A phase row's value is the model's phase unwrapped to within ±180° of the
                        // measured one, so target − value is the wrapped phase residual.
                        for (int r = 0; r < nph; r++) {
                            int k = phaseAt[r];
                            v[n + r] = (mDeg[r] - LogMagnitudeModel.wrapDeg(mDeg[r] - deg[k])) / uDeg[r];
                            for (int c = 0; c < p; c++) {
                                j[n + r][c] = jacDeg[k][c] / uDeg[r];
                            }
                        }
                        for (int c = 0; c < p; c++) {
                            v[n + nph + c] = priors.get(c).residual(x[c]);
                            j[n + nph + c][c] = priors.get(c).residualSlope(x[c]);
                        }
                        return new Pair<RealVector, RealMatrix>(new ArrayRealVector(v, false),
                                new Array2DRowRealMatrix(j, false));
                    })
                    .parameterValidator(point -> {
                        RealVector c = point.copy();
                        for (int k = 0; k < p; k++) {
                            c.setEntry(k, Math.max(-MAX_LN_RATIO, Math.min(MAX_LN_RATIO, c.getEntry(k))));
                        }
                        return c;
                    })
                    // Stop at MAX_ITERATIONS with the point reached (rather than throw): the χ² test then
                    // reports whatever misfit is left. The optimiser's own tolerances end most fits far earlier.
                    .checker((iteration, previous, current) -> iteration >= MAX_ITERATIONS)
                    .maxIterations(MAX_ITERATIONS + 10)
                    .maxEvaluations(MAX_EVALUATIONS)
                    .build();
            LeastSquaresOptimizer.Optimum opt = new LevenbergMarquardtOptimizer().optimize(problem);
            double c = opt.getCost();
            return new Fit(opt.getPoint().toArray(), c * c, opt.getIterations());
        }
    }

    private static int[] trustedIndices(MeasuredResponse m) {
        boolean[] t = m.trusted();
        int[] idx = new int[m.trustedCount()];
        int c = 0;
        for (int i = 0; i < t.length; i++) {
            if (t[i]) {
                idx[c++] = i;
            }
        }
        return idx;
    }

    /** Σ((m − d)/u²)/Σ(1/u²): the least-squares level offset of d onto m. */
    private static double weightedOffset(double[] m, double[] d, double[] u) {
        double num = 0;
        double den = 0;
        for (int k = 0; k < m.length; k++) {
            double w = 1 / (u[k] * u[k]);
            num += w * (m[k] - d[k]);
            den += w;
        }
        return num / den;
    }

    /** Normal mass of N(mu, s²) outside [lo, hi]. */
    static double probabilityOutside(double mu, double s, double lo, double hi) {
        if (!(s > 0)) {
            return mu < lo || mu > hi ? 1 : 0;
        }
        NormalDistribution nd = new NormalDistribution(mu, s);
        return nd.cumulativeProbability(lo) + (1 - nd.cumulativeProbability(hi));
    }

    /** Inverse of a symmetric positive (semi)definite matrix, by eigen-decomposition (pseudo-inverse on null directions). */
    private static RealMatrix inverse(RealMatrix matrix) {
        EigenDecompositionSymmetric e = new EigenDecompositionSymmetric(matrix);
        double[] ev = e.getEigenvalues();
        double max = Arrays.stream(ev).map(Math::abs).max().orElse(0);
        RealMatrix v = e.getV();
        int q = ev.length;
        double[][] out = new double[q][q];
        for (int k = 0; k < q; k++) {
            if (!(ev[k] > max * 1e-14)) {
                continue;
            }
            for (int a = 0; a < q; a++) {
                double va = v.getEntry(a, k) / ev[k];
                for (int b = 0; b < q; b++) {
                    out[a][b] += va * v.getEntry(b, k);
                }
            }
        }
        return new Array2DRowRealMatrix(out, false);
    }

    /**
     * Sets of parts the data cannot resolve better than their priors (class description).
     *
     * @param fisher data-only information over θ (and the level offset, last, when free)
     */
    static List<List<String>> ambiguityGroups(List<PartPrior> priors, double[][] fisher, double[] sigma, boolean free) {
        int p = priors.size();
        double[][] f = new double[p][p];
        for (int a = 0; a < p; a++) {
            for (int b = 0; b < p; b++) {
                f[a][b] = fisher[a][b];
                if (free && fisher[p][p] > 0) {
                    f[a][b] -= fisher[a][p] * fisher[p][b] / fisher[p][p];
                }
            }
        }
        // Whitened information M = D·F·D, D = diag(σ): its eigenvalues are the generalised ones of F v = λ P v.
        double[][] mw = new double[p][p];
        for (int a = 0; a < p; a++) {
            for (int b = 0; b < p; b++) {
                mw[a][b] = sigma[a] * f[a][b] * sigma[b];
            }
        }
        EigenDecompositionSymmetric e = new EigenDecompositionSymmetric(new Array2DRowRealMatrix(mw, false));
        List<double[]> basis = new ArrayList<>();
        for (int k = 0; k < p; k++) {
            if (e.getEigenvalue(k) < 1) {
                double[] v = new double[p];
                for (int a = 0; a < p; a++) {
                    v[a] = sigma[a] * e.getEigenvector(k).getEntry(a);
                }
                // Gram–Schmidt in ln(value) coordinates.
                for (double[] b : basis) {
                    double d = dot(v, b);
                    for (int a = 0; a < p; a++) {
                        v[a] -= d * b[a];
                    }
                }
                double norm = Math.sqrt(dot(v, v));
                if (norm > 1e-12) {
                    for (int a = 0; a < p; a++) {
                        v[a] /= norm;
                    }
                    basis.add(v);
                }
            }
        }
        double[][] proj = new double[p][p];
        for (double[] b : basis) {
            for (int a = 0; a < p; a++) {
                for (int c = 0; c < p; c++) {
                    proj[a][c] += b[a] * b[c];
                }
            }
        }
        int[] group = new int[p];
        Arrays.fill(group, -1);
        List<List<String>> groups = new ArrayList<>();
        for (int a = 0; a < p; a++) {
            if (group[a] >= 0 || proj[a][a] < GROUP_SHARE) {
                continue;
            }
            List<String> members = new ArrayList<>();
            List<Integer> queue = new ArrayList<>(List.of(a));
            group[a] = groups.size();
            while (!queue.isEmpty()) {
                int i = queue.remove(queue.size() - 1);
                members.add(priors.get(i).designator());
                for (int c = 0; c < p; c++) {
                    if (group[c] < 0 && proj[c][c] >= GROUP_SHARE
                            && Math.abs(proj[i][c]) >= GROUP_LINK * Math.sqrt(proj[i][i] * proj[c][c])) {
                        group[c] = groups.size();
                        queue.add(c);
                    }
                }
            }
            List<String> ordered = new ArrayList<>();
            for (PartPrior pr : priors) {
                if (members.contains(pr.designator())) {
                    ordered.add(pr.designator());
                }
            }
            groups.add(ordered);
        }
        return groups;
    }

    private static double dot(double[] a, double[] b) {
        double s = 0;
        for (int i = 0; i < a.length; i++) {
            s += a[i] * b[i];
        }
        return s;
    }

    /** Locale-independent formatting for messages. */
    static final class Numbers {
        private Numbers() {
        }

        static String of(String format, Object... args) {
            return String.format(java.util.Locale.ROOT, format, args);
        }
    }
}
