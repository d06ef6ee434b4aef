package org.roseate.model;

import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.roseate.circuit.CircuitOpAmp;
import org.roseate.circuit.CircuitStage;
import org.roseate.circuit.OpAmp;

/**
 * Modified nodal analysis of a {@link CircuitStage}: the equations' structure, prepared once, and
 * a complex LU factorisation with partial pivoting into a caller's {@link Workspace}, which
 * allocates nothing per frequency.
 *
 * <p><b>Formulation</b> (Ho, Ruehli and Brennan's modified nodal analysis, as in any circuit
 * simulation text; the stamps are common practice). Unknowns: the voltages of the nodes other
 * than {@code gnd} and the input node, then one output current per op-amp. Rows: Kirchhoff's
 * current law at each of those nodes (currents leaving the node through branches equal the
 * current injected from outside), then one row per op-amp: v+ − v− − v_out/A(s) = 0. An ideal
 * op-amp has 1/A = 0 (a nullor: the output current is unknown and v+ = v−); a finite one has
 * 1/A(s) = 1/A0 + s/(2π·GBW), a voltage-controlled voltage source with the single-pole gain.
 * The input node's voltage is fixed at 1 V by the ideal source, so its column moves to the right
 * side. Branch admittances enter multiplied by {@link #REFERENCE_OHMS} (so audio RC values sit
 * near 1 beside the op-amp rows' unit entries): every current row is in units of R0·A = volts.
 *
 * <p>The matrix is M(s) = Σ_b Y_b(s)·R0·u_b·u_bᵀ + (op-amp terms), a rank-one update per branch
 * and one entry per op-amp gain, so its determinant is affine in each Y_b and in each 1/A; this
 * is what bounds the degree of the rational function ({@link NodalModel#rational()}).
 *
 * <p>Immutable and thread-safe; each thread uses its own {@link #workspace()}.
 */
public final class NodalSolver {
    /** Admittances are scaled by this resistance: 10 kΩ (common practice for audio RC work). */
    public static final double REFERENCE_OHMS = 1e4;
    /** Marks a terminal on {@code gnd}. */
    public static final int GROUND = -1;
    /** Marks a terminal on the driven input node. */
    public static final int INPUT = -2;

    private final int size;
    private final int nodeCount;
    private final List<String> nodeNames;
    private final Map<String, Integer> nodeIndex;
    private final List<String> branchKeys;
    private final int[] branchA;
    private final int[] branchB;
    private final int output;
    private final List<String> opampNames;
    private final int[] opPlus;
    private final int[] opMinus;
    private final int[] opOut;
    private final double[] invGainDc;
    private final double[] invGainPerRadPerS;

    private NodalSolver(CircuitStage stage) {
        String in = stage.input();
        List<String> names = new ArrayList<>();
        for (String n : stage.nodes()) {
            if (!n.equals(in)) {
                names.add(n);
            }
        }
        nodeNames = List.copyOf(names);
        Map<String, Integer> idx = new LinkedHashMap<>();
        for (int i = 0; i < names.size(); i++) {
            idx.put(names.get(i), i);
        }
        idx.put(in, INPUT);
        idx.put(CircuitStage.GROUND, GROUND);
        nodeIndex = Collections.unmodifiableMap(idx);
        nodeCount = names.size();
        branchKeys = List.copyOf(stage.branches().keySet());
        branchA = new int[branchKeys.size()];
        branchB = new int[branchKeys.size()];
        for (int b = 0; b < branchKeys.size(); b++) {
            String[] ab = branchKeys.get(b).split(" ");
            branchA[b] = idx.get(ab[0]);
            branchB[b] = idx.get(ab[1]);
        }
        output = idx.get(stage.output());
        opampNames = List.copyOf(stage.opamps().keySet());
        int m = opampNames.size();
        opPlus = new int[m];
        opMinus = new int[m];
        opOut = new int[m];
        invGainDc = new double[m];
        invGainPerRadPerS = new double[m];
        for (int k = 0; k < m; k++) {
            CircuitOpAmp op = stage.opamps().get(opampNames.get(k));
            opPlus[k] = idx.get(op.plus());
            opMinus[k] = idx.get(op.minus());
            opOut[k] = idx.get(op.output());
            OpAmp.InverseGain g = op.model().inverseGain();
            invGainDc[k] = g.dc();
            invGainPerRadPerS[k] = g.perRadPerS();
        }
        size = nodeCount + m;
    }

    /** The equations of a circuit stage, whose structure the constructor of CircuitStage checked. */
    public static NodalSolver of(CircuitStage stage) {
        return new NodalSolver(stage);
    }

    /** Number of unknowns: nodes other than gnd and the input, plus one per op-amp. */
    public int size() {
        return size;
    }

    /** Branch keys in the order of the admittance arrays ({@code "in a"}, …). */
    public List<String> branchKeys() {
        return branchKeys;
    }

    /** The unknown nodes, in index order (gnd and the input node are not unknowns). */
    public List<String> nodeNames() {
        return nodeNames;
    }

    /** Op-amp designators in row order: op-amp k's row and current column is {@code nodeNames().size() + k}. */
    public List<String> opampNames() {
        return opampNames;
    }

    /** Index of a node's unknown; {@value #GROUND} for gnd, {@value #INPUT} for the input; null if unknown. */
    public Integer nodeIndex(String name) {
        return nodeIndex.get(name);
    }

    /** Index of the output node's unknown ({@value #INPUT} when the output is the input node). */
    int outputIndex() {
        return output;
    }

    public Workspace workspace() {
        return new Workspace(size, branchKeys.size(), opOut.length);
    }

    /**
     * Buffers for one thread: the factored matrix, the right side, the solution and the adjoint
     * solution, and the branch admittances the caller fills before {@link #factor}.
     */
    public static final class Workspace {
        final double[] re;
        final double[] im;
        final int[] perm;
        final double[] rhsRe;
        final double[] rhsIm;
        final double[] tmpRe;
        final double[] tmpIm;
        final double[] origRe;
        final double[] origIm;
        /** Node voltages (V per V of input) after {@link NodalSolver#solve}, then op-amp currents (R0·A). */
        public final double[] xRe;
        public final double[] xIm;
        /** The adjoint solution after {@link NodalSolver#solveAdjoint}. */
        public final double[] adjRe;
        public final double[] adjIm;
        /** Branch admittances times R0 (dimensionless), in {@link #branchKeys()} order. */
        public final double[] yRe;
        public final double[] yIm;
        /**
         * Per op-amp, in {@link #opampNames()} order, its gbwHz as a multiple of the file's (1 unless a
         * tolerance run draws it; finite and &gt; 0): the s/(2π·GBW) term of 1/A(s) is divided by it.
         */
        public final double[] gbwFactor;
        double minPivotRatio;
        double detRe;
        double detIm;
        int detExponent;

        Workspace(int n, int branches, int opamps) {
            gbwFactor = new double[opamps];
            java.util.Arrays.fill(gbwFactor, 1.0);
            re = new double[n * n];
            im = new double[n * n];
            perm = new int[n];
            rhsRe = new double[n];
            rhsIm = new double[n];
            tmpRe = new double[n];
            tmpIm = new double[n];
            origRe = new double[n * n];
            origIm = new double[n * n];
            xRe = new double[n];
            xIm = new double[n];
            adjRe = new double[n];
            adjIm = new double[n];
            yRe = new double[branches];
            yIm = new double[branches];
        }

        /**
         * min |U_kk| / max |M_ij| of the last factorisation: near 1e-16 or below for equations
         * that are singular (up to rounding); 0 when a pivot was exactly zero.
         */
        public double minPivotRatio() {
            return minPivotRatio;
        }
    }

    /**
     * Builds M(s) from the admittances in {@code w.yRe/yIm} (each Y·R0) and the op-amp gains at
     * s = sRe + j·sIm (rad/s), and factors it. Allocates nothing.
     *
     * @return false if a pivot was exactly zero (the other results are then meaningless)
     */
    public boolean factor(double sRe, double sIm, Workspace w) {
        int n = size;
        double[] re = w.re;
        double[] im = w.im;
        java.util.Arrays.fill(re, 0);
        java.util.Arrays.fill(im, 0);
        java.util.Arrays.fill(w.rhsRe, 0);
        java.util.Arrays.fill(w.rhsIm, 0);
        for (int b = 0; b < branchA.length; b++) {
            double yr = w.yRe[b];
            double yi = w.yIm[b];
            int a = branchA[b];
            int c = branchB[b];
            if (a >= 0) {
                re[a * n + a] += yr;
                im[a * n + a] += yi;
                if (c >= 0) {
                    re[a * n + c] -= yr;
                    im[a * n + c] -= yi;
                } else if (c == INPUT) {
                    w.rhsRe[a] += yr;
                    w.rhsIm[a] += yi;
                }
            }
            if (c >= 0) {
                re[c * n + c] += yr;
                im[c * n + c] += yi;
                if (a >= 0) {
                    re[c * n + a] -= yr;
                    im[c * n + a] -= yi;
                } else if (a == INPUT) {
                    w.rhsRe[c] += yr;
                    w.rhsIm[c] += yi;
                }
            }
        }
        for (int k = 0; k < opOut.length; k++) {
            int r = nodeCount + k;
            int o = opOut[k];
            re[o * n + r] -= 1;
            stampPin(w, r, opPlus[k], 1);
            stampPin(w, r, opMinus[k], -1);
            // −v_out·(1/A0 + s/(2π·GBW))
            double perRadPerS = invGainPerRadPerS[k] / w.gbwFactor[k];
            re[r * n + o] -= invGainDc[k] + sRe * perRadPerS;
            im[r * n + o] -= sIm * perRadPerS;
        }
        System.arraycopy(re, 0, w.origRe, 0, re.length);
        System.arraycopy(im, 0, w.origIm, 0, im.length);
        return decompose(w);
    }

    private void stampPin(Workspace w, int row, int node, double sign) {
        if (node >= 0) {
            w.re[row * size + node] += sign;
        } else if (node == INPUT) {
            w.rhsRe[row] -= sign;
        }
    }

    /** In-place LU with partial pivoting (P·M = L·U, L unit lower); records det and the pivot ratio. */
    private boolean decompose(Workspace w) {
        int n = size;
        double[] re = w.re;
        double[] im = w.im;
        int[] perm = w.perm;
        double maxEntry = 0;
        for (int i = 0; i < n * n; i++) {
            maxEntry = Math.max(maxEntry, Math.abs(re[i]) + Math.abs(im[i]));
        }
        for (int i = 0; i < n; i++) {
            perm[i] = i;
        }
        double dr = 1;
        double di = 0;
        int exp = 0;
        double minPivot = Double.POSITIVE_INFINITY;
        for (int k = 0; k < n; k++) {
            int p = k;
            double best = Math.abs(re[k * n + k]) + Math.abs(im[k * n + k]);
            for (int i = k + 1; i < n; i++) {
                double m = Math.abs(re[i * n + k]) + Math.abs(im[i * n + k]);
                if (m > best) {
                    best = m;
                    p = i;
                }
            }
            if (best == 0) {
                w.minPivotRatio = 0;
                w.detRe = 0;
                w.detIm = 0;
                w.detExponent = 0;
                return false;
            }
            if (p != k) {
                for (int j = 0; j < n; j++) {
                    double t = re[k * n + j];
                    re[k * n + j] = re[p * n + j];
                    re[p * n + j] = t;
                    t = im[k * n + j];
                    im[k * n + j] = im[p * n + j];
                    im[p * n + j] = t;
                }
                int t = perm[k];
                perm[k] = perm[p];
                perm[p] = t;
                dr = -dr;
                di = -di;
            }
            double pr = re[k * n + k];
            double pi = im[k * n + k];
            minPivot = Math.min(minPivot, Math.hypot(pr, pi));
            double t = dr * pr - di * pi;
            di = dr * pi + di * pr;
            dr = t;
            int e = Math.getExponent(Math.max(Math.abs(dr), Math.abs(di)));
            if (e > 64 || e < -64) {
                dr = Math.scalb(dr, -e);
                di = Math.scalb(di, -e);
                exp += e;
            }
            double pm = pr * pr + pi * pi;
            double ir = pr / pm;
            double ii = -pi / pm;
            for (int i = k + 1; i < n; i++) {
                double ar = re[i * n + k];
                double ai = im[i * n + k];
                if (ar == 0 && ai == 0) {
                    continue;
                }
                double lr = ar * ir - ai * ii;
                double li = ar * ii + ai * ir;
                re[i * n + k] = lr;
                im[i * n + k] = li;
                int ri = i * n;
                int rk = k * n;
                for (int j = k + 1; j < n; j++) {
                    double ur = re[rk + j];
                    double ui = im[rk + j];
                    re[ri + j] -= lr * ur - li * ui;
                    im[ri + j] -= lr * ui + li * ur;
                }
            }
        }
        w.minPivotRatio = n == 0 ? 1 : minPivot / maxEntry;
        w.detRe = dr;
        w.detIm = di;
        w.detExponent = exp;
        return true;
    }

    /**
     * Solves M·x = b for the unit input drive after {@link #factor}: {@code w.xRe/xIm} then hold
     * the node voltages (V per V at the input) in {@link #nodeNames()} order, then the op-amp
     * output currents times R0. Uses the adjoint buffers as scratch: call
     * {@link #solveAdjoint} after this, not before.
     */
    public void solve(Workspace w) {
        substitute(w.rhsRe, w.rhsIm, w.xRe, w.xIm, w);
        // One step of iterative refinement in working precision: r = b − M·x, M·d = r, x += d.
        // It brings small node voltages (a deeply attenuated output) to full relative accuracy
        // where plain LU gives them only relative to the largest voltage (Skeel's componentwise
        // analysis; Higham, Accuracy and Stability of Numerical Algorithms, ch. 12). Skipped when
        // the output is within 60 dB of the largest unknown, where it is already accurate to
        // about 1e-13.
        int n = size;
        if (output >= 0) {
            double largest = 0;
            for (int i = 0; i < n; i++) {
                largest = Math.max(largest, Math.abs(w.xRe[i]) + Math.abs(w.xIm[i]));
            }
            if ((Math.abs(w.xRe[output]) + Math.abs(w.xIm[output])) * 1e3 >= largest) {
                return;
            }
        }
        double[] rr = w.tmpRe;
        double[] ri = w.tmpIm;
        for (int i = 0; i < n; i++) {
            double sr = w.rhsRe[i];
            double si = w.rhsIm[i];
            int row = i * n;
            for (int j = 0; j < n; j++) {
                double mr = w.origRe[row + j];
                double mi = w.origIm[row + j];
                if (mr != 0 || mi != 0) {
                    sr -= mr * w.xRe[j] - mi * w.xIm[j];
                    si -= mr * w.xIm[j] + mi * w.xRe[j];
                }
            }
            rr[i] = sr;
            ri[i] = si;
        }
        double[] dr = w.adjRe;
        double[] di = w.adjIm;
        substitute(rr, ri, dr, di, w);
        for (int i = 0; i < n; i++) {
            w.xRe[i] += dr[i];
            w.xIm[i] += di[i];
        }
    }

    /** Forward and back substitution of P·M = L·U for right side b into x (x may not alias b). */
    private void substitute(double[] bRe, double[] bIm, double[] xr, double[] xi, Workspace w) {
        int n = size;
        double[] re = w.re;
        double[] im = w.im;
        for (int i = 0; i < n; i++) {
            double sr = bRe[w.perm[i]];
            double si = bIm[w.perm[i]];
            int ri = i * n;
            for (int j = 0; j < i; j++) {
                double lr = re[ri + j];
                double li = im[ri + j];
                sr -= lr * xr[j] - li * xi[j];
                si -= lr * xi[j] + li * xr[j];
            }
            xr[i] = sr;
            xi[i] = si;
        }
        for (int i = n - 1; i >= 0; i--) {
            double sr = xr[i];
            double si = xi[i];
            int ri = i * n;
            for (int j = i + 1; j < n; j++) {
                double ur = re[ri + j];
                double ui = im[ri + j];
                sr -= ur * xr[j] - ui * xi[j];
                si -= ur * xi[j] + ui * xr[j];
            }
            double pr = re[ri + i];
            double pi = im[ri + i];
            double pm = pr * pr + pi * pi;
            xr[i] = (sr * pr + si * pi) / pm;
            xi[i] = (si * pr - sr * pi) / pm;
        }
    }

    /**
     * Solves the transposed system Mᵀ·a = e_out (a unit at the output node's row) after
     * {@link #factor}, into {@code w.adjRe/adjIm}. By reciprocity of the adjoint, a right side r
     * gives v_out = aᵀ·r: a current J (A) injected into node p and taken out of node q makes
     * v_out = R0·J·(a_p − a_q) (a_gnd = a_input = 0), and a voltage e in series with op-amp k's
     * plus input makes v_out = −a_(row k)·e.
     */
    public void solveAdjoint(Workspace w) {
        int n = size;
        double[] re = w.re;
        double[] im = w.im;
        double[] tr = w.adjRe;
        double[] ti = w.adjIm;
        java.util.Arrays.fill(tr, 0);
        java.util.Arrays.fill(ti, 0);
        if (output < 0) {
            return;
        }
        // Uᵀ·t = e_out (forward), then Lᵀ·z = t (backward), then a[perm[i]] = z[i].
        double[] zr = w.tmpRe;
        double[] zi = w.tmpIm;
        for (int i = 0; i < n; i++) {
            double sr = i == output ? 1 : 0;
            double si = 0;
            for (int j = 0; j < i; j++) {
                double ur = re[j * n + i];
                double ui = im[j * n + i];
                sr -= ur * zr[j] - ui * zi[j];
                si -= ur * zi[j] + ui * zr[j];
            }
            double pr = re[i * n + i];
            double pi = im[i * n + i];
            double pm = pr * pr + pi * pi;
            zr[i] = (sr * pr + si * pi) / pm;
            zi[i] = (si * pr - sr * pi) / pm;
        }
        for (int i = n - 1; i >= 0; i--) {
            double sr = zr[i];
            double si = zi[i];
            for (int j = i + 1; j < n; j++) {
                double lr = re[j * n + i];
                double li = im[j * n + i];
                sr -= lr * zr[j] - li * zi[j];
                si -= lr * zi[j] + li * zr[j];
            }
            zr[i] = sr;
            zi[i] = si;
        }
        for (int i = 0; i < n; i++) {
            tr[w.perm[i]] = zr[i];
            ti[w.perm[i]] = zi[i];
        }
    }

    /** Re v_out after {@link #solve}: 1 when the output is the input node. */
    public double outputRe(Workspace w) {
        return output >= 0 ? w.xRe[output] : output == INPUT ? 1 : 0;
    }

    /** Im v_out after {@link #solve}. */
    public double outputIm(Workspace w) {
        return output >= 0 ? w.xIm[output] : 0;
    }
}
