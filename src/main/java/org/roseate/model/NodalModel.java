package org.roseate.model;

import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.roseate.circuit.CircuitStage;
import org.roseate.circuit.DesignException;
import org.roseate.circuit.DesignReader;
import org.roseate.circuit.Network;

/**
 * The exact model of a {@link CircuitStage} by modified nodal analysis ({@link NodalSolver}): its
 * response H(jω) = v_out for 1 V at the input, the node voltages and the adjoint solution at one
 * frequency (for noise budgets), each branch's two-terminal impedance, and the rational function
 * N(x)/D(x), x = s/ω0, for poles, zeros and the digital path. Immutable and thread-safe.
 *
 * <h2>API for noise budgets</h2>
 * <pre>{@code
 * NodalModel m = NodalModel.of(stage, 1, "design.json");
 * NodalModel.Solution at = m.solve(1000);                 // one frequency, Hz
 * Complex h   = at.output();                              // v_out per volt at the input
 * Complex va  = at.nodeVoltage("a");                      // V per volt at the input
 * Complex zt  = at.currentToOutputOhms("a", "gnd");       // v_out per ampere into a, out of gnd
 * Complex gen = at.opampPlusVoltageToOutput("U1");        // v_out per volt in series with U1's plus pin
 * Complex zb  = m.branchImpedance("a gnd", 1000);         // the branch as a two-terminal, Ω
 * }</pre>
 * The thermal noise of a passive branch is 4kT·Re Z_b (V²/Hz) in series with it, or 4kT·Re(1/Z_b)
 * (A²/Hz) across it (Nyquist's theorem for a two-terminal network); its voltage at the output is
 * {@code currentToOutputOhms(a, b)} times that current. An op-amp's current noise at a pin is a
 * current from gnd into the pin's node. Each call solves M and Mᵀ once (two triangular solves on
 * one LU); for many frequencies use {@link #workspace()} with {@link NodalSolver#factor},
 * {@link NodalSolver#solve} and {@link NodalSolver#solveAdjoint} directly.
 */
public final class NodalModel {
    /** Below this ratio of the smallest pivot to the largest entry the equations count as singular. */
    static final double SINGULAR_PIVOT_RATIO = 1e-11;
    /** Test frequencies of the singularity check: well spread, none a round number. */
    private static final double[] PROBE_HZ = {0.0713, 1.37, 23.9, 417, 7310, 127_000, 2_230_000};

    private final CircuitStage stage;
    private final NodalSolver solver;
    private final ImpedanceProgram[] programs;
    private final Polynomial[][] branchPolys;
    private final int stackDepth;
    private final double omegaScale;
    private final RationalFunction rational;

    NodalModel(CircuitStage stage, int number, String source, double omegaScaleRadPerS) {
        this.stage = stage;
        this.omegaScale = omegaScaleRadPerS;
        solver = NodalSolver.of(stage);
        List<String> keys = solver.branchKeys();
        programs = new ImpedanceProgram[keys.size()];
        branchPolys = new Polynomial[keys.size()][];
        int depth = 1;
        for (int b = 0; b < keys.size(); b++) {
            Network n = stage.branches().get(keys.get(b));
            Polynomial[] z = RationalBuilder.impedance(n, omegaScaleRadPerS);
            String what = null;
            if (!z[0].isFinite() || !z[1].isFinite()) {
                what = "its values are out of range (impedance overflows)";
            } else if (z[0].isZero()) {
                what = "it is a short circuit at every frequency";
            } else if (z[1].isZero()) {
                what = "it is an open circuit at every frequency";
            }
            if (what != null) {
                throw new DesignException(source + ": stage " + number + " branch '" + keys.get(b) + "': " + what
                        + "; check the values", number, "branches" + DesignReader.PATH_SEPARATOR + keys.get(b), 0);
            }
            branchPolys[b] = z;
            programs[b] = ImpedanceProgram.compile(n);
            depth = Math.max(depth, programs[b].stackDepth());
        }
        stackDepth = depth;
        checkSolvable(number, source);
        rational = buildRational(number, source);
    }

    /**
     * Builds the model of one circuit stage; {@code number} (1-based) and {@code source} name it in
     * error messages.
     *
     * @throws DesignException if a branch is short or open at every frequency, or the equations
     *                         are singular at every frequency (an ideal op-amp without a feedback
     *                         path, for example)
     */
    public static NodalModel of(CircuitStage stage, int number, String source) {
        return new NodalModel(stage, number, source, CircuitModel.OMEGA_SCALE_RAD_PER_S);
    }

    private void checkSolvable(int number, String source) {
        Workspace w = workspace();
        for (double hz : PROBE_HZ) {
            if (factorAt(2 * Math.PI * hz, w) && w.nodal.minPivotRatio() > SINGULAR_PIVOT_RATIO) {
                return;
            }
        }
        throw new DesignException(source + ": stage " + number + " (circuit): the circuit's equations are singular at every "
                + "frequency (an ideal op-amp with no feedback path, or a part of the circuit the rest cannot drive); "
                + "check the op-amp pins and the branches", number, "opamps", 0);
    }

    public CircuitStage stage() {
        return stage;
    }

    /** The equations' structure, for callers that fill their own admittances (the tools' fast loops). */
    public NodalSolver solver() {
        return solver;
    }

    /** Per-thread buffers for {@link #response(double[], double[], double[], Workspace)}. */
    public Workspace workspace() {
        return new Workspace(solver.workspace(), new double[stackDepth], new double[stackDepth], new double[2]);
    }

    /** Buffers for one thread: the solver's workspace and the impedance programs' stacks. */
    public record Workspace(NodalSolver.Workspace nodal, double[] stackRe, double[] stackIm, double[] z) {
    }

    /** Fills the branch admittances (×R0) at jω and factors; false if exactly singular. */
    private boolean factorAt(double omegaRadPerS, Workspace w) {
        NodalSolver.Workspace nw = w.nodal;
        double[] z = w.z;
        for (int b = 0; b < programs.length; b++) {
            programs[b].evaluate(omegaRadPerS, w.stackRe, w.stackIm, z);
            // Y·R0 = R0/Z = R0·conj(Z)/|Z|²
            double m = NodalSolver.REFERENCE_OHMS / (z[0] * z[0] + z[1] * z[1]);
            nw.yRe[b] = z[0] * m;
            nw.yIm[b] = -z[1] * m;
        }
        return solver.factor(0, omegaRadPerS, nw);
    }

    /** Factors and solves M·x = b at jω (node voltages into the workspace). */
    void solveAt(double omegaRadPerS, Workspace w) {
        factorAt(omegaRadPerS, w);
        solver.solve(w.nodal);
    }

    /**
     * H(j·2π·hz[i]) into re[i], im[i]: one LU per frequency, no allocation.
     *
     * @param hz frequencies in Hz, each finite and &gt; 0
     */
    public void response(double[] hz, double[] re, double[] im, Workspace w) {
        for (int i = 0; i < hz.length; i++) {
            solveAt(2 * Math.PI * hz[i], w);
            re[i] = solver.outputRe(w.nodal);
            im[i] = solver.outputIm(w.nodal);
        }
    }

    /** H(j·2π·hz). */
    public Complex response(double hz) {
        Workspace w = workspace();
        solveAt(2 * Math.PI * hz, w);
        return new Complex(solver.outputRe(w.nodal), solver.outputIm(w.nodal));
    }

    /** The impedance of branch {@code key} ("a b") on its own, Ω, at j·2π·hz. */
    public Complex branchImpedance(String key, double hz) {
        int b = solver.branchKeys().indexOf(key);
        if (b < 0) {
            throw new IllegalArgumentException("no branch '" + key + "'; branches: " + solver.branchKeys());
        }
        double[] re = new double[stackDepth];
        double[] im = new double[stackDepth];
        double[] z = new double[2];
        programs[b].evaluate(2 * Math.PI * hz, re, im, z);
        return new Complex(z[0], z[1]);
    }

    /** The circuit solved at one frequency, forwards (unit input) and adjoint (unit at the output). */
    public Solution solve(double hz) {
        Workspace w = workspace();
        solveAt(2 * Math.PI * hz, w);
        solver.solveAdjoint(w.nodal);
        NodalSolver.Workspace n = w.nodal;
        return new Solution(hz, n.xRe.clone(), n.xIm.clone(), n.adjRe.clone(), n.adjIm.clone());
    }

    /**
     * Node voltages and the adjoint solution at one frequency. Node names as in the design file;
     * {@code gnd} reads 0 and the input node 1 (and 0 in the adjoint, since the source holds it).
     */
    public final class Solution {
        private final double hz;
        private final double[] xRe;
        private final double[] xIm;
        private final double[] aRe;
        private final double[] aIm;

        private Solution(double hz, double[] xRe, double[] xIm, double[] aRe, double[] aIm) {
            this.hz = hz;
            this.xRe = xRe;
            this.xIm = xIm;
            this.aRe = aRe;
            this.aIm = aIm;
        }

        public double hz() {
            return hz;
        }

        /** v_out per volt at the input: H(j·2π·hz). */
        public Complex output() {
            return nodeVoltage(stage.output());
        }

        /** A node's voltage per volt at the input. */
        public Complex nodeVoltage(String node) {
            int i = index(node);
            return i >= 0 ? new Complex(xRe[i], xIm[i]) : Complex.real(i == NodalSolver.INPUT ? 1 : 0);
        }

        /**
         * v_out per ampere injected into node {@code into} and drawn out of node {@code outOf}
         * (transimpedance, Ω): R0·(a_into − a_outOf) from the adjoint solution a.
         */
        public Complex currentToOutputOhms(String into, String outOf) {
            Complex a = adjoint(into).minus(adjoint(outOf));
            return a.times(NodalSolver.REFERENCE_OHMS);
        }

        /** v_out per volt of a source in series with op-amp {@code designator}'s plus input: −a_row. */
        public Complex opampPlusVoltageToOutput(String designator) {
            int k = solver.opampNames().indexOf(designator);
            if (k < 0) {
                throw new IllegalArgumentException("no op-amp '" + designator + "'; op-amps: " + solver.opampNames());
            }
            int r = solver.nodeNames().size() + k;
            return new Complex(-aRe[r], -aIm[r]);
        }

        private Complex adjoint(String node) {
            int i = index(node);
            return i >= 0 ? new Complex(aRe[i], aIm[i]) : Complex.ZERO;
        }

        private int index(String node) {
            Integer i = solver.nodeIndex(node);
            if (i == null) {
                throw new IllegalArgumentException("no node '" + node + "'; nodes: " + stage.nodes() + " and gnd");
            }
            return i;
        }
    }

    /** N(x)/D(x), x = s/ω0: see {@link #buildRational}. */
    public RationalFunction rational() {
        return rational;
    }

    /** Radii of the interpolation circles in x = s/ω0: one per decade, 0.1 mHz·… to 10 MHz·… in s/2π. */
    private static final double[] RADII = {1e-4, 1e-3, 1e-2, 1e-1, 1, 1e1, 1e2, 1e3, 1e4};
    /** A coefficient whose term never reaches this fraction of the polynomial's size on any circle is zero. */
    private static final double NEGLIGIBLE_TERM = 1e-9;

    /**
     * The rational function by interpolation of the nodal determinant.
     *
     * <p>Why it is exact: M(x) is a sum of rank-one terms Y_b·u_b·u_bᵀ, one per branch, plus
     * one entry 1/A(x) per op-amp, so det M is affine in each Y_b and each 1/A (multilinearity of
     * the determinant). With Z_b = N_b/D_b (series/parallel polynomial algebra of the branch's
     * network), D(x) = det M(x)·∏N_b(x) is therefore a polynomial of degree at most
     * Σ_b max(deg N_b, deg D_b) + (number of finite op-amps), a bound that is at most the number of
     * reactive parts plus op-amp poles; and N(x) = D(x)·v_out(x) is the same for the Cramer
     * cofactor of the output. Sampling both at K = bound + 1 points x_k = ρ·e^{jθ_k} on a circle and
     * taking the inverse discrete Fourier transform gives c_j·ρ^j exactly up to rounding (a unitary
     * map, so no error growth). One circle cannot resolve coefficients whose terms differ by many
     * decades, so the circuit is sampled on one circle per decade of radius and each coefficient
     * is taken from the circle where its term c_j·ρ^j is largest relative to the samples of N and
     * D (N = D·v_out inherits D's rounding, so the larger of the two sets the floor) (a
     * Newton-polygon argument: the term of each coefficient dominates near the radius of the roots
     * around it). Terms that stay below {@value #NEGLIGIBLE_TERM} of the samples on every circle are
     * zero; that trims degrees the bound overestimates. Common roots of N and D are removed
     * afterwards, with the zpk form ({@link StageModel}).
     *
     * <p>Why not the alternatives: symbolic elimination on polynomial matrices is exact too but
     * needs fraction-free elimination with growing degrees and pivoting by degree; the generalised
     * eigenvalues of the pencil (G, C) need a QZ algorithm and give the poles only. Interpolation
     * reuses the nodal solver that computes the response, so both forms share their equations.
     */
    private RationalFunction buildRational(int number, String source) {
        int bound = 0;
        for (Polynomial[] z : branchPolys) {
            bound += Math.max(z[0].degree(), z[1].degree());
        }
        for (var op : stage.opamps().values()) {
            bound += op.model().isIdeal() ? 0 : 1;
        }
        int k = bound + 1;
        double[] bestNum = new double[k];
        double[] bestDen = new double[k];
        double[] sigNum = new double[k];
        double[] sigDen = new double[k];
        NodalSolver.Workspace w = solver.workspace();
        double[] pnRe = new double[k];
        double[] pnIm = new double[k];
        double[] pdRe = new double[k];
        double[] pdIm = new double[k];
        int[] exps = new int[k];
        for (double rho : RADII) {
            int maxExp = Integer.MIN_VALUE;
            for (int i = 0; i < k; i++) {
                double theta = 2 * Math.PI * (i + 0.5) / k;
                Complex x = new Complex(rho * Math.cos(theta), rho * Math.sin(theta));
                // ∏N_b(x), with Y_b·R0 = D_b/N_b into the workspace
                double prodRe = 1;
                double prodIm = 0;
                int prodExp = 0;
                for (int b = 0; b < branchPolys.length; b++) {
                    Complex nb = branchPolys[b][0].evaluate(x);
                    Complex db = branchPolys[b][1].evaluate(x);
                    Complex y = db.dividedBy(nb);
                    w.yRe[b] = y.re();
                    w.yIm[b] = y.im();
                    double t = prodRe * nb.re() - prodIm * nb.im();
                    prodIm = prodRe * nb.im() + prodIm * nb.re();
                    prodRe = t;
                    int e = Math.getExponent(Math.max(Math.abs(prodRe), Math.abs(prodIm)));
                    prodRe = Math.scalb(prodRe, -e);
                    prodIm = Math.scalb(prodIm, -e);
                    prodExp += e;
                }
                solver.factor(x.re() * omegaScale, x.im() * omegaScale, w);
                solver.solve(w);
                double dr = w.detRe * prodRe - w.detIm * prodIm;
                double di = w.detRe * prodIm + w.detIm * prodRe;
                double vr = solver.outputRe(w);
                double vi = solver.outputIm(w);
                pdRe[i] = dr;
                pdIm[i] = di;
                pnRe[i] = dr * vr - di * vi;
                pnIm[i] = dr * vi + di * vr;
                exps[i] = w.detExponent + prodExp;
                if (dr != 0 || di != 0) {
                    maxExp = Math.max(maxExp, exps[i]);
                }
            }
            if (maxExp == Integer.MIN_VALUE) {
                continue;
            }
            for (int i = 0; i < k; i++) {
                int shift = exps[i] - maxExp;
                pdRe[i] = Math.scalb(pdRe[i], shift);
                pdIm[i] = Math.scalb(pdIm[i], shift);
                pnRe[i] = Math.scalb(pnRe[i], shift);
                pnIm[i] = Math.scalb(pnIm[i], shift);
            }
            // N_k = D_k·v_out carries D_k's rounding, so both are judged against the larger samples.
            double scale = 0;
            for (int i = 0; i < k; i++) {
                scale = Math.max(scale, Math.max(Math.hypot(pnRe[i], pnIm[i]), Math.hypot(pdRe[i], pdIm[i])));
            }
            pick(pnRe, pnIm, rho, maxExp, scale, bestNum, sigNum);
            pick(pdRe, pdIm, rho, maxExp, scale, bestDen, sigDen);
        }
        for (int j = 0; j < k; j++) {
            if (sigNum[j] < NEGLIGIBLE_TERM) {
                bestNum[j] = 0;
            }
            if (sigDen[j] < NEGLIGIBLE_TERM) {
                bestDen[j] = 0;
            }
        }
        Polynomial num = new Polynomial(bestNum);
        Polynomial den = new Polynomial(bestDen);
        Polynomial[] pr = RationalBuilder.pair(num, den);
        if (!pr[0].isFinite() || !pr[1].isFinite() || pr[1].isZero()) {
            throw new DesignException(source + ": stage " + number + ": component values are out of range "
                    + "(the transfer function cannot be represented)", number, null, 0);
        }
        return new RationalFunction(pr[0], pr[1], omegaScale);
    }

    /**
     * Inverse DFT of samples on the circle |x| = ρ (scaled by 2^exp); keeps each coefficient from
     * the circle where its term is largest relative to {@code scale}, the largest sample of N or D
     * there (the size of the rounding in both).
     */
    private static void pick(double[] re, double[] im, double rho, int exp, double scale, double[] best, double[] significance) {
        int k = re.length;
        if (scale == 0) {
            return;
        }
        for (int j = 0; j < k; j++) {
            double sr = 0;
            double si = 0;
            for (int i = 0; i < k; i++) {
                double theta = -2 * Math.PI * j * (i + 0.5) / k;
                double c = Math.cos(theta);
                double s = Math.sin(theta);
                sr += re[i] * c - im[i] * s;
                si += re[i] * s + im[i] * c;
            }
            sr /= k;
            si /= k;
            double sig = Math.hypot(sr, si) / scale;
            if (sig > significance[j]) {
                significance[j] = sig;
                // c_j = (term / ρ^j)·2^exp; the imaginary part is rounding (real circuit).
                best[j] = Math.scalb(sr / Math.pow(rho, j), exp);
            }
        }
    }

    /** The branches by key, as the model uses them. */
    Map<String, Network> branches() {
        return stage.branches();
    }

    /** For tests: the degree bound of the interpolation. */
    List<Integer> branchDegrees() {
        List<Integer> d = new ArrayList<>();
        for (Polynomial[] z : branchPolys) {
            d.add(Math.max(z[0].degree(), z[1].degree()));
        }
        return d;
    }
}
