package org.roseate.model;

import java.util.ArrayList;
import java.util.List;
import org.roseate.circuit.Component;
import org.roseate.circuit.Network;
import org.roseate.circuit.Parallel;
import org.roseate.circuit.Series;

/**
 * A network compiled to a postfix program, so its impedance at jω is evaluated with a few
 * multiply-adds on primitive doubles: no tree walk, no objects per point. Exact complex
 * arithmetic on the impedance tree: Z_R = R, Z_C = 1/(jωC), Z_L = jωL, series Z = Σ Zi, parallel
 * Z = 1/Σ(1/Zi) (common practice, any circuits text). Immutable and thread-safe; each call
 * supplies its own scratch stack.
 */
final class ImpedanceProgram {
    private static final byte R = 0;
    private static final byte C = 1;
    private static final byte L = 2;
    private static final byte SERIES = 3;
    private static final byte PARALLEL = 4;

    private final byte[] ops;
    private final double[] args;
    private final int[] counts;
    private final int stackDepth;

    private ImpedanceProgram(byte[] ops, double[] args, int[] counts, int stackDepth) {
        this.ops = ops;
        this.args = args;
        this.counts = counts;
        this.stackDepth = stackDepth;
    }

    static ImpedanceProgram compile(Network network) {
        List<Byte> ops = new ArrayList<>();
        List<Double> args = new ArrayList<>();
        List<Integer> counts = new ArrayList<>();
        int depth = emit(network, ops, args, counts);
        byte[] o = new byte[ops.size()];
        double[] a = new double[ops.size()];
        int[] n = new int[ops.size()];
        for (int i = 0; i < o.length; i++) {
            o[i] = ops.get(i);
            a[i] = args.get(i);
            n[i] = counts.get(i);
        }
        return new ImpedanceProgram(o, a, n, depth);
    }

    /** Emits code for {@code n}; returns the stack depth it needs. */
    private static int emit(Network n, List<Byte> ops, List<Double> args, List<Integer> counts) {
        if (n instanceof Component c) {
            ops.add(switch (c.kind()) {
                case RESISTOR -> R;
                case CAPACITOR -> C;
                case INDUCTOR -> L;
            });
            args.add(c.value());
            counts.add(0);
            return 1;
        }
        if (n instanceof Series s) {
            return chain(s.parts(), SERIES, ops, args, counts);
        }
        return chain(((Parallel) n).parts(), PARALLEL, ops, args, counts);
    }

    private static int chain(List<Network> parts, byte op, List<Byte> ops, List<Double> args, List<Integer> counts) {
        int depth = 0;
        for (int i = 0; i < parts.size(); i++) {
            depth = Math.max(depth, i + emit(parts.get(i), ops, args, counts));
        }
        ops.add(op);
        args.add(0.0);
        counts.add(parts.size());
        return depth;
    }

    int stackDepth() {
        return stackDepth;
    }

    /**
     * Z(jω) into {@code out[0]} (real, Ω) and {@code out[1]} (imaginary, Ω).
     *
     * @param omegaRadPerS angular frequency in rad/s, &gt; 0
     * @param re           scratch of length ≥ {@link #stackDepth()}
     * @param im           scratch of length ≥ {@link #stackDepth()}
     */
    void evaluate(double omegaRadPerS, double[] re, double[] im, double[] out) {
        int sp = 0;
        for (int i = 0; i < ops.length; i++) {
            switch (ops[i]) {
                case R -> {
                    re[sp] = args[i];
                    im[sp] = 0;
                    sp++;
                }
                case C -> {
                    re[sp] = 0;
                    im[sp] = -1 / (omegaRadPerS * args[i]);
                    sp++;
                }
                case L -> {
                    re[sp] = 0;
                    im[sp] = omegaRadPerS * args[i];
                    sp++;
                }
                case SERIES -> {
                    int n = counts[i];
                    int base = sp - n;
                    double sr = 0;
                    double si = 0;
                    for (int k = base; k < sp; k++) {
                        sr += re[k];
                        si += im[k];
                    }
                    re[base] = sr;
                    im[base] = si;
                    sp = base + 1;
                }
                default -> {
                    int n = counts[i];
                    int base = sp - n;
                    double yr = 0;
                    double yi = 0;
                    for (int k = base; k < sp; k++) {
                        // 1/Z = conj(Z)/|Z|²
                        double m = re[k] * re[k] + im[k] * im[k];
                        yr += re[k] / m;
                        yi -= im[k] / m;
                    }
                    double m = yr * yr + yi * yi;
                    re[base] = yr / m;
                    im[base] = -yi / m;
                    sp = base + 1;
                }
            }
        }
        out[0] = re[0];
        out[1] = im[0];
    }
}
