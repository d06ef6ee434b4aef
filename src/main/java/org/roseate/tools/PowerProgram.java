package org.roseate.tools;

import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.roseate.circuit.CircuitStage;
import org.roseate.circuit.Component;
import org.roseate.circuit.Design;
import org.roseate.circuit.DividerStage;
import org.roseate.circuit.InvertingStage;
import org.roseate.circuit.Network;
import org.roseate.circuit.NonInvertingStage;
import org.roseate.circuit.OpAmp;
import org.roseate.circuit.Parallel;
import org.roseate.circuit.Series;
import org.roseate.circuit.Stage;
import org.roseate.model.NodalSolver;
import org.roseate.value.ComponentKind;

/**
 * A design compiled for repeated evaluation of the power gain |H(j·2π·f)|² with the component
 * values supplied as an array (one slot per component, in {@link Design#components()} order).
 * The tools' optimiser and Monte Carlo loops call this thousands of times per second; the
 * formulas are the model package's (H = −Zf/Zin, 1 + Zf/Zg, Zshunt'/(Zseries + Zshunt'), the
 * single-pole op-amp A = A0/(1 + jω·A0/(2π·GBW))), written again here on primitive doubles so
 * that {@link org.roseate.model.CircuitModel} stays an independent check of it.
 * One frequency at a time ({@link #power}) or a fixed set of them in blocks ({@link #powers}, the
 * fast path of {@link Scorer}); the two give bitwise equal results.
 * Immutable and thread-safe; each thread evaluates through its own {@link Workspace}.
 */
final class PowerProgram {
    private static final int PUSH_Z = 0;
    private static final int PUSH_Y = 1;
    private static final int SUM = 2;
    private static final int INVERT = 3;
    private static final int KIND_INVERTING = 0;
    private static final int KIND_NONINVERTING = 1;
    private static final int KIND_DIVIDER = 2;
    private static final int KIND_CIRCUIT = 3;

    private final List<Component> parts;
    private final Map<String, Integer> slots;
    /** 0 resistor, 1 capacitor, 2 inductor, per slot. */
    private final int[] kindCode;
    /** Per stage: kind, then the programs of its two networks (a = output side, b = input side). */
    private final int[] stageKind;
    private final int[][] programA;
    private final int[][] programB;
    private final int[][] programLoad;
    private final double[] openLoopGain;
    private final double[] tauSeconds;
    /** Per circuit stage: its nodal equations and one program per branch (null for other kinds). */
    private final NodalSolver[] nodal;
    private final int[][][] branchPrograms;
    /** The same networks compiled for {@link #powers} ({@link #compileBlock}). */
    private final int[][] blockA;
    private final int[][] blockB;
    private final int[][] blockLoad;
    private final int[][][] blockBranches;
    private final int depth;
    /**
     * Frequencies per pass of {@link #powers}: the batch stacks (depth × 2 × BLOCK doubles) stay
     * in the first-level cache for the usual depths of 3 to 8 (common practice for blocked loops).
     */
    static final int BLOCK = 128;

    private PowerProgram(Design design) {
        parts = design.components();
        slots = new HashMap<>();
        kindCode = new int[parts.size()];
        for (int i = 0; i < parts.size(); i++) {
            slots.put(parts.get(i).designator(), i);
            kindCode[i] = parts.get(i).kind() == ComponentKind.RESISTOR ? 0
                    : parts.get(i).kind() == ComponentKind.CAPACITOR ? 1 : 2;
        }
        int n = design.stages().size();
        stageKind = new int[n];
        programA = new int[n][];
        programB = new int[n][];
        programLoad = new int[n][];
        openLoopGain = new double[n];
        tauSeconds = new double[n];
        nodal = new NodalSolver[n];
        branchPrograms = new int[n][][];
        blockA = new int[n][];
        blockB = new int[n][];
        blockLoad = new int[n][];
        blockBranches = new int[n][][];
        int d = 1;
        for (int s = 0; s < n; s++) {
            Stage st = design.stages().get(s);
            Network a;
            Network b;
            if (st instanceof CircuitStage c) {
                stageKind[s] = KIND_CIRCUIT;
                // a circuit's op-amps live in its nodal equations; a tolerance run spreads their
                // gbwHz through the nodal workspace's gbwFactor
                openLoopGain[s] = Double.POSITIVE_INFINITY;
                nodal[s] = NodalSolver.of(c);
                List<String> keys = nodal[s].branchKeys();
                branchPrograms[s] = new int[keys.size()][];
                blockBranches[s] = new int[keys.size()][];
                for (int k = 0; k < keys.size(); k++) {
                    Network net = c.branches().get(keys.get(k));
                    branchPrograms[s][k] = compile(net);
                    blockBranches[s][k] = compileBlock(net);
                    d = Math.max(d, depth(net));
                }
                continue;
            }
            if (st instanceof InvertingStage inv) {
                stageKind[s] = KIND_INVERTING;
                a = inv.feedback();
                b = inv.input();
            } else if (st instanceof NonInvertingStage non) {
                stageKind[s] = KIND_NONINVERTING;
                a = non.feedback();
                b = non.ground();
            } else {
                DividerStage div = (DividerStage) st;
                stageKind[s] = KIND_DIVIDER;
                a = div.shunt();
                b = div.series();
                programLoad[s] = div.load().map(this::compile).orElse(null);
                blockLoad[s] = div.load().map(this::compileBlock).orElse(null);
            }
            programA[s] = compile(a);
            programB[s] = compile(b);
            blockA[s] = compileBlock(a);
            blockB[s] = compileBlock(b);
            OpAmp op = st.opamp().filter(o -> !o.isIdeal()).orElse(null);
            openLoopGain[s] = op == null ? Double.POSITIVE_INFINITY : op.openLoopGain();
            tauSeconds[s] = op == null ? 0 : op.poleTimeConstantSeconds();
            d = Math.max(d, Math.max(depth(a), depth(b)));
            if (programLoad[s] != null) {
                d = Math.max(d, depth(div(st).load().get()));
            }
        }
        depth = d + 1;
    }

    private static DividerStage div(Stage s) {
        return (DividerStage) s;
    }

    static PowerProgram of(Design design) {
        return new PowerProgram(design);
    }

    /** The components in slot order. */
    List<Component> parts() {
        return parts;
    }

    int size() {
        return parts.size();
    }

    /** The slot of a designator, or -1. */
    int slot(String designator) {
        Integer i = slots.get(designator);
        return i == null ? -1 : i;
    }

    /** The design's own values, in slot order. */
    double[] nominal() {
        double[] v = new double[parts.size()];
        for (int i = 0; i < v.length; i++) {
            v[i] = parts.get(i).value();
        }
        return v;
    }

    Workspace workspace() {
        NodalSolver.Workspace[] n = new NodalSolver.Workspace[nodal.length];
        for (int s = 0; s < n.length; s++) {
            n[s] = nodal[s] == null ? null : nodal[s].workspace();
        }
        int branches = 0;
        for (int[][] b : branchPrograms) {
            branches = Math.max(branches, b == null ? 0 : b.length);
        }
        return new Workspace(depth, kindCode.length, n, branches);
    }

    int stageCount() {
        return stageKind.length;
    }

    /**
     * The index of circuit stage s's op-amp {@code designator} in its nodal workspace's
     * {@link NodalSolver.Workspace#gbwFactor}, or -1 when stage s is not a circuit stage or has no
     * such op-amp.
     */
    int circuitOpAmpIndex(int s, String designator) {
        return nodal[s] == null ? -1 : nodal[s].opampNames().indexOf(designator);
    }

    /**
     * Sets an op-amp's gbwHz as a multiple of the design's for the next {@link #power} calls:
     * stage s's single op-amp (k = -1) or circuit op-amp k of stage s.
     */
    static void setGbwFactor(int s, int k, double factor, Workspace w) {
        if (k < 0) {
            w.gbwFactor[s] = factor;
        } else {
            w.nodal[s].gbwFactor[k] = factor;
        }
    }

    /** Whether stage s has a (non-ideal) op-amp model. */
    boolean hasOpAmp(int s) {
        return Double.isFinite(openLoopGain[s]);
    }

    /** Per-thread stacks; allocation happens here, never in {@link #power}. */
    static final class Workspace {
        final double[] re;
        final double[] im;
        final double[] values;
        final double[] inverse;
        final NodalSolver.Workspace[] nodal;
        /** Per stage, the op-amp's gbwHz as a multiple of the design's (1 unless a tolerance run draws it). */
        final double[] gbwFactor;

        /** Batch stacks of {@link #powers}: slot t of frequency i at t·{@link #BLOCK} + i. */
        final double[] blockRe;
        final double[] blockIm;
        /** Batch per-frequency temporaries: running product, output-side impedance, branch admittances. */
        final double[] blockAcc = new double[BLOCK];
        final double[] blockAr = new double[BLOCK];
        final double[] blockAi = new double[BLOCK];
        final double[] blockYRe;
        final double[] blockYIm;

        Workspace(int depth, int parts, NodalSolver.Workspace[] nodal, int branches) {
            re = new double[depth];
            im = new double[depth];
            values = new double[parts];
            inverse = new double[parts];
            this.nodal = nodal;
            gbwFactor = new double[nodal.length];
            java.util.Arrays.fill(gbwFactor, 1.0);
            blockRe = new double[depth * BLOCK];
            blockIm = new double[depth * BLOCK];
            blockYRe = new double[branches * BLOCK];
            blockYIm = new double[branches * BLOCK];
        }
    }

    /** A postfix program leaving the network's impedance on the stack. */
    private int[] compile(Network n) {
        List<Integer> ops = new ArrayList<>();
        emit(n, false, ops);
        return ops.stream().mapToInt(Integer::intValue).toArray();
    }

    /**
     * Emits code leaving the impedance ({@code admittance} false) or the admittance of n: series
     * chains sum impedances, parallel groups sum admittances, and a single reciprocal converts
     * where a chain meets a group, so a leaf costs no division.
     */
    private void emit(Network n, boolean admittance, List<Integer> ops) {
        if (n instanceof Component c) {
            ops.add((admittance ? PUSH_Y : PUSH_Z) | slots.get(c.designator()) << 2);
            return;
        }
        boolean parallel = n instanceof Parallel;
        List<Network> ps = parallel ? ((Parallel) n).parts() : ((Series) n).parts();
        ps.forEach(p -> emit(p, parallel, ops));
        ops.add(SUM | ps.size() << 2);
        if (parallel != admittance) {
            ops.add(INVERT);
        }
    }

    private static int depth(Network n) {
        if (n instanceof Component) {
            return 1;
        }
        List<Network> ps = n instanceof Series s ? s.parts() : ((Parallel) n).parts();
        int d = 0;
        for (int i = 0; i < ps.size(); i++) {
            d = Math.max(d, i + depth(ps.get(i)));
        }
        return d;
    }

    /**
     * Sets the component values (Ω, F, H in slot order, each finite and &gt; 0) that
     * {@link #power} uses. Allocates nothing.
     */
    void load(double[] values, Workspace w) {
        for (int i = 0; i < kindCode.length; i++) {
            w.values[i] = values[i];
            w.inverse[i] = 1 / values[i];
        }
    }

    /**
     * |H(jω)|² of the cascade at ω = omegaRadPerS (&gt; 0) for the values last
     * {@link #load loaded}. Allocates nothing.
     */
    double power(double omegaRadPerS, Workspace w) {
        double acc = 1;
        double[] re = w.re;
        double[] im = w.im;
        for (int s = 0; s < stageKind.length; s++) {
            if (stageKind[s] == KIND_CIRCUIT) {
                acc *= circuitPower(s, omegaRadPerS, w);
                continue;
            }
            run(programA[s], omegaRadPerS, w);
            double ar = re[0];
            double ai = im[0];
            run(programB[s], omegaRadPerS, w);
            double br = re[0];
            double bi = im[0];
            double p;
            if (stageKind[s] == KIND_DIVIDER) {
                if (programLoad[s] != null) {
                    run(programLoad[s], omegaRadPerS, w);
                    // Za' = Za·Zl/(Za + Zl)
                    double nr = ar * re[0] - ai * im[0];
                    double ni = ar * im[0] + ai * re[0];
                    double dr = ar + re[0];
                    double di = ai + im[0];
                    double m = dr * dr + di * di;
                    ar = (nr * dr + ni * di) / m;
                    ai = (ni * dr - nr * di) / m;
                }
                double dr = ar + br;
                double di = ai + bi;
                p = (ar * ar + ai * ai) / (dr * dr + di * di);
            } else {
                double m = br * br + bi * bi;
                double gr = (ar * br + ai * bi) / m;
                double gi = (ai * br - ar * bi) / m;
                double tr = stageKind[s] == KIND_INVERTING ? -gr : 1 + gr;
                double ti = stageKind[s] == KIND_INVERTING ? -gi : gi;
                double num = tr * tr + ti * ti;
                if (Double.isInfinite(openLoopGain[s])) {
                    p = num;
                } else {
                    double invAr = 1 / openLoopGain[s];
                    double invAi = omegaRadPerS * tauSeconds[s] / (openLoopGain[s] * w.gbwFactor[s]);
                    double opr = 1 + gr;
                    double dr = 1 + opr * invAr - gi * invAi;
                    double di = opr * invAi + gi * invAr;
                    p = num / (dr * dr + di * di);
                }
            }
            acc *= p;
        }
        return acc;
    }

    /**
     * A fixed set of angular frequencies ω (rad/s, each &gt; 0) with 1/ω hoisted, for
     * {@link #powers}. Immutable.
     */
    static final class Frequencies {
        final double[] omega;
        final double[] inverseOmega;

        Frequencies(double[] omegaRadPerS) {
            omega = omegaRadPerS.clone();
            inverseOmega = new double[omega.length];
            for (int i = 0; i < omega.length; i++) {
                inverseOmega[i] = 1 / omega[i];
            }
        }

        int size() {
            return omega.length;
        }
    }

    /**
     * |H(jω)|² at every frequency of f, for the values last {@link #load loaded}, into
     * {@code out[0 … f.size() − 1]}. The same arithmetic as {@link #power}, operation for operation
     * and in the same order (Java evaluates doubles strictly and never contracts to fused
     * multiply-adds), so each result is bitwise equal to {@code power(f.omega[i], w)}; what differs
     * is the loop order, each instruction of {@link #compileBlock}'s code running over a block of
     * {@link #BLOCK} frequencies (structure of arrays, ω and 1/ω hoisted into f) instead of each
     * frequency running the whole program, and that sums accumulate in place without their exact
     * +0 addends. Allocates nothing.
     */
    void powers(Frequencies f, Workspace w, double[] out) {
        int n = f.size();
        for (int from = 0; from < n; from += BLOCK) {
            powersBlock(f.omega, f.inverseOmega, from, Math.min(BLOCK, n - from), w, out);
        }
    }

    private void powersBlock(double[] omega, double[] invOmega, int from, int len, Workspace w, double[] out) {
        double[] acc = w.blockAcc;
        double[] re = w.blockRe;
        double[] im = w.blockIm;
        double[] ar = w.blockAr;
        double[] ai = w.blockAi;
        java.util.Arrays.fill(acc, 0, len, 1.0);
        for (int s = 0; s < stageKind.length; s++) {
            if (stageKind[s] == KIND_CIRCUIT) {
                circuitPowers(s, omega, invOmega, from, len, w);
                continue;
            }
            runBlock(blockA[s], omega, invOmega, from, len, w);
            System.arraycopy(re, 0, ar, 0, len);
            System.arraycopy(im, 0, ai, 0, len);
            if (stageKind[s] == KIND_DIVIDER) {
                if (programLoad[s] != null) {
                    runBlock(blockLoad[s], omega, invOmega, from, len, w);
                    for (int i = 0; i < len; i++) {
                        double xr = ar[i];
                        double xi = ai[i];
                        double lr = re[i];
                        double li = im[i];
                        double nr = xr * lr - xi * li;
                        double ni = xr * li + xi * lr;
                        double dr = xr + lr;
                        double di = xi + li;
                        double m = dr * dr + di * di;
                        ar[i] = (nr * dr + ni * di) / m;
                        ai[i] = (ni * dr - nr * di) / m;
                    }
                }
                runBlock(blockB[s], omega, invOmega, from, len, w);
                for (int i = 0; i < len; i++) {
                    double xr = ar[i];
                    double xi = ai[i];
                    double dr = xr + re[i];
                    double di = xi + im[i];
                    acc[i] *= (xr * xr + xi * xi) / (dr * dr + di * di);
                }
                continue;
            }
            runBlock(blockB[s], omega, invOmega, from, len, w);
            boolean inverting = stageKind[s] == KIND_INVERTING;
            boolean ideal = Double.isInfinite(openLoopGain[s]);
            double invAr = 1 / openLoopGain[s];
            double tau = tauSeconds[s];
            double gainTimesFactor = openLoopGain[s] * w.gbwFactor[s];
            for (int i = 0; i < len; i++) {
                double xr = ar[i];
                double xi = ai[i];
                double br = re[i];
                double bi = im[i];
                double m = br * br + bi * bi;
                double gr = (xr * br + xi * bi) / m;
                double gi = (xi * br - xr * bi) / m;
                double tr = inverting ? -gr : 1 + gr;
                double ti = inverting ? -gi : gi;
                double num = tr * tr + ti * ti;
                double p;
                if (ideal) {
                    p = num;
                } else {
                    double invAi = omega[from + i] * tau / gainTimesFactor;
                    double opr = 1 + gr;
                    double dr = 1 + opr * invAr - gi * invAi;
                    double di = opr * invAi + gi * invAr;
                    p = num / (dr * dr + di * di);
                }
                acc[i] *= p;
            }
        }
        System.arraycopy(acc, 0, out, from, len);
    }

    /** {@link #circuitPower} over a block: branch programs batched, the nodal solve per frequency. */
    private void circuitPowers(int s, double[] omega, double[] invOmega, int from, int len, Workspace w) {
        NodalSolver.Workspace nw = w.nodal[s];
        int[][] programs = blockBranches[s];
        double[] re = w.blockRe;
        double[] im = w.blockIm;
        double[] yRe = w.blockYRe;
        double[] yIm = w.blockYIm;
        for (int k = 0; k < programs.length; k++) {
            runBlock(programs[k], omega, invOmega, from, len, w);
            int o = k * BLOCK;
            for (int i = 0; i < len; i++) {
                double m = NodalSolver.REFERENCE_OHMS / (re[i] * re[i] + im[i] * im[i]);
                yRe[o + i] = re[i] * m;
                yIm[o + i] = -im[i] * m;
            }
        }
        double[] acc = w.blockAcc;
        for (int i = 0; i < len; i++) {
            for (int k = 0; k < programs.length; k++) {
                nw.yRe[k] = yRe[k * BLOCK + i];
                nw.yIm[k] = yIm[k * BLOCK + i];
            }
            nodal[s].factor(0, omega[from + i], nw);
            nodal[s].solve(nw);
            double hr = nodal[s].outputRe(nw);
            double hi = nodal[s].outputIm(nw);
            acc[i] *= hr * hr + hi * hi;
        }
    }

    // Block instructions: op (3 bits) | leaf form (2 bits) << 3 | slot (8 bits) << 5 | part slot << 13.
    private static final int B_SET = 0;
    private static final int B_START = 1;
    private static final int B_ADD = 2;
    private static final int B_START_SLOT = 3;
    private static final int B_ADD_SLOT = 4;
    private static final int B_INVERT = 5;
    /** Leaf forms: re = value, re = 1/value, im = ω·value, im = −(1/value)·(1/ω). */
    private static final int FORM_VALUE = 0;
    private static final int FORM_INVERSE = 1;
    private static final int FORM_OMEGA_VALUE = 2;
    private static final int FORM_MINUS_INVERSE_OVER_OMEGA = 3;

    /**
     * The network compiled for {@link #runBlock}: the postfix program's sums accumulate in place
     * as each addend is made (same addends, same left-to-right order from 0), and a leaf adds only
     * its non-zero part. Skipping a +0 addend is exact: an accumulator starts as 0 + x, which is
     * never −0, and a sum is −0 only when both addends are, so adding +0 never changes it.
     */
    private int[] compileBlock(Network n) {
        List<Integer> ops = new ArrayList<>();
        if (n instanceof Component c) {
            ops.add(leafOp(B_SET, c, false, 0));
        } else {
            emitBlock(n, false, 0, ops);
        }
        return ops.stream().mapToInt(Integer::intValue).toArray();
    }

    private int leafOp(int op, Component c, boolean admittance, int slot) {
        int k = kindCode[slots.get(c.designator())];
        int form = k == 0 ? (admittance ? FORM_INVERSE : FORM_VALUE)
                : (k == 1) == admittance ? FORM_OMEGA_VALUE : FORM_MINUS_INVERSE_OVER_OMEGA;
        if (slot > 255) {
            throw new IllegalArgumentException("network nested too deeply: " + slot + " levels");
        }
        return op | form << 3 | slot << 5 | slots.get(c.designator()) << 13;
    }

    /** Code leaving group n's impedance ({@code admittance} false) or admittance in the given slot. */
    private void emitBlock(Network n, boolean admittance, int slot, List<Integer> ops) {
        boolean parallel = n instanceof Parallel;
        List<Network> ps = parallel ? ((Parallel) n).parts() : ((Series) n).parts();
        for (int i = 0; i < ps.size(); i++) {
            Network p = ps.get(i);
            if (p instanceof Component c) {
                ops.add(leafOp(i == 0 ? B_START : B_ADD, c, parallel, slot));
            } else if (i == 0) {
                emitBlock(p, parallel, slot, ops);
                ops.add(B_START_SLOT | slot << 5);
            } else {
                emitBlock(p, parallel, slot + 1, ops);
                ops.add(B_ADD_SLOT | slot << 5);
            }
        }
        if (parallel != admittance) {
            ops.add(B_INVERT | slot << 5);
        }
    }

    /**
     * {@link #run} over a block of frequencies, one pass per instruction of
     * {@link #compileBlock}'s code; the impedance of frequency from + i ends in blockRe[i],
     * blockIm[i], bitwise equal to run's.
     */
    private void runBlock(int[] program, double[] omega, double[] invOmega, int from, int len, Workspace ws) {
        double[] re = ws.blockRe;
        double[] im = ws.blockIm;
        double[] v = ws.values;
        double[] inv = ws.inverse;
        for (int op : program) {
            int code = op & 7;
            int form = op >>> 3 & 3;
            int o = (op >>> 5 & 255) * BLOCK;
            int part = op >>> 13;
            switch (code) {
                case B_SET, B_START -> {
                    // B_START is 0 + leaf: the same value, except that −0 becomes +0
                    double zero = code == B_SET ? 0.0 : 0 + 0.0;
                    if (form == FORM_VALUE || form == FORM_INVERSE) {
                        double r = form == FORM_VALUE ? v[part] : inv[part];
                        java.util.Arrays.fill(re, o, o + len, code == B_SET ? r : 0 + r);
                        java.util.Arrays.fill(im, o, o + len, zero);
                    } else {
                        java.util.Arrays.fill(re, o, o + len, zero);
                        if (form == FORM_OMEGA_VALUE) {
                            double x = v[part];
                            if (code == B_SET) {
                                for (int i = 0; i < len; i++) {
                                    im[o + i] = omega[from + i] * x;
                                }
                            } else {
                                for (int i = 0; i < len; i++) {
                                    im[o + i] = 0 + omega[from + i] * x;
                                }
                            }
                        } else {
                            double x = -inv[part];
                            if (code == B_SET) {
                                for (int i = 0; i < len; i++) {
                                    im[o + i] = x * invOmega[from + i];
                                }
                            } else {
                                for (int i = 0; i < len; i++) {
                                    im[o + i] = 0 + x * invOmega[from + i];
                                }
                            }
                        }
                    }
                }
                case B_ADD -> {
                    if (form == FORM_VALUE || form == FORM_INVERSE) {
                        double r = form == FORM_VALUE ? v[part] : inv[part];
                        for (int i = 0; i < len; i++) {
                            re[o + i] += r;
                        }
                    } else if (form == FORM_OMEGA_VALUE) {
                        double x = v[part];
                        for (int i = 0; i < len; i++) {
                            im[o + i] += omega[from + i] * x;
                        }
                    } else {
                        double x = -inv[part];
                        for (int i = 0; i < len; i++) {
                            im[o + i] += x * invOmega[from + i];
                        }
                    }
                }
                case B_START_SLOT -> {
                    for (int i = 0; i < len; i++) {
                        re[o + i] = 0 + re[o + i];
                        im[o + i] = 0 + im[o + i];
                    }
                }
                case B_ADD_SLOT -> {
                    int next = o + BLOCK;
                    for (int i = 0; i < len; i++) {
                        re[o + i] += re[next + i];
                        im[o + i] += im[next + i];
                    }
                }
                default -> {
                    for (int i = 0; i < len; i++) {
                        double a = re[o + i];
                        double b = im[o + i];
                        double m = 1 / (a * a + b * b);
                        re[o + i] = a * m;
                        im[o + i] = -b * m;
                    }
                }
            }
        }
    }

    /**
     * |v_out|² of a circuit stage: branch impedances from the slot values, then the model's own
     * nodal equations ({@link NodalSolver}), whose independent check is the numpy solver's data.
     */
    private double circuitPower(int s, double omegaRadPerS, Workspace w) {
        NodalSolver.Workspace nw = w.nodal[s];
        int[][] programs = branchPrograms[s];
        for (int k = 0; k < programs.length; k++) {
            run(programs[k], omegaRadPerS, w);
            double m = NodalSolver.REFERENCE_OHMS / (w.re[0] * w.re[0] + w.im[0] * w.im[0]);
            nw.yRe[k] = w.re[0] * m;
            nw.yIm[k] = -w.im[0] * m;
        }
        nodal[s].factor(0, omegaRadPerS, nw);
        nodal[s].solve(nw);
        double hr = nodal[s].outputRe(nw);
        double hi = nodal[s].outputIm(nw);
        return hr * hr + hi * hi;
    }

    /** Runs a network program at ω; the impedance ends in re[0], im[0]. */
    private void run(int[] program, double w, Workspace ws) {
        double[] re = ws.re;
        double[] im = ws.im;
        double[] v = ws.values;
        double[] inv = ws.inverse;
        double invW = 1 / w;
        int top = 0;
        for (int op : program) {
            int arg = op >>> 2;
            switch (op & 3) {
                case PUSH_Z -> {
                    int k = kindCode[arg];
                    re[top] = k == 0 ? v[arg] : 0;
                    im[top] = k == 0 ? 0 : k == 1 ? -inv[arg] * invW : w * v[arg];
                    top++;
                }
                case PUSH_Y -> {
                    int k = kindCode[arg];
                    re[top] = k == 0 ? inv[arg] : 0;
                    im[top] = k == 0 ? 0 : k == 1 ? w * v[arg] : -inv[arg] * invW;
                    top++;
                }
                case SUM -> {
                    double sr = 0;
                    double si = 0;
                    for (int k = top - arg; k < top; k++) {
                        sr += re[k];
                        si += im[k];
                    }
                    top -= arg;
                    re[top] = sr;
                    im[top] = si;
                    top++;
                }
                default -> {
                    double a = re[top - 1];
                    double b = im[top - 1];
                    double m = 1 / (a * a + b * b);
                    re[top - 1] = a * m;
                    im[top - 1] = -b * m;
                }
            }
        }
    }
}
