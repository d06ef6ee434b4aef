package org.roseate.budget;

import java.util.ArrayList;
import java.util.List;
import org.roseate.circuit.Component;
import org.roseate.circuit.Network;
import org.roseate.circuit.Parallel;
import org.roseate.circuit.Series;
import org.roseate.value.ComponentKind;

/**
 * A branch network compiled for noise: its impedance Z_b(jω) and, for every resistor inside it,
 * the factor G_k by which a voltage in series with that resistor appears in series with the whole
 * branch.
 *
 * <p><b>Derivation on the impedance tree.</b> Put the resistor's thermal noise e_k (4kTR_k V²/Hz)
 * in series with it. Walking up the tree from the resistor:
 * <ul>
 * <li>In a <em>series</em> chain a voltage in series with one part is in series with the chain
 *     (Kirchhoff's voltage law around the loop): factor 1.</li>
 * <li>In a <em>parallel</em> group P a voltage e in series with part i (impedance Z_i) is, by
 *     Thévenin–Norton, a current e/Z_i across Z_i, hence across the whole group, hence a voltage
 *     e·Z_P/Z_i in series with the group: factor Z_P/Z_i.</li>
 * </ul>
 * So G_k = ∏ Z_P/Z_child over the parallel groups on the path from the resistor to the branch's
 * root, and the branch carries a Thévenin voltage e_k·G_k in series with Z_b, i.e. a Norton
 * current e_k·G_k/Z_b across its two nodes, which the nodal model carries to the output. The check
 * is Nyquist's theorem for a two-terminal network: Σ_k 4kTR_k·|G_k|² = 4kT·Re Z_b (tested).
 *
 * <p>Evaluation allocates nothing; each thread supplies its own scratch arrays of {@link #size()}.
 */
final class BranchNoise {
    private static final byte R = 0;
    private static final byte C = 1;
    private static final byte L = 2;
    private static final byte SERIES = 3;
    private static final byte PARALLEL = 4;

    /** Tree nodes in post-order (children before parents; the root last). */
    private final byte[] op;
    private final double[] value;
    private final int[] parent;
    private final int[][] children;
    private final int[] resistorNode;
    private final String[] resistorDesignator;
    private final double[] resistorOhms;

    private BranchNoise(byte[] op, double[] value, int[] parent, int[][] children, List<Integer> rNodes,
            List<Component> resistors) {
        this.op = op;
        this.value = value;
        this.parent = parent;
        this.children = children;
        resistorNode = rNodes.stream().mapToInt(Integer::intValue).toArray();
        resistorDesignator = resistors.stream().map(Component::designator).toArray(String[]::new);
        resistorOhms = resistors.stream().mapToDouble(Component::value).toArray();
    }

    static BranchNoise compile(Network network) {
        List<Byte> ops = new ArrayList<>();
        List<Double> values = new ArrayList<>();
        List<int[]> kids = new ArrayList<>();
        List<Integer> rNodes = new ArrayList<>();
        List<Component> resistors = new ArrayList<>();
        emit(network, ops, values, kids, rNodes, resistors);
        int n = ops.size();
        byte[] o = new byte[n];
        double[] v = new double[n];
        int[] parent = new int[n];
        int[][] children = new int[n][];
        java.util.Arrays.fill(parent, -1);
        for (int i = 0; i < n; i++) {
            o[i] = ops.get(i);
            v[i] = values.get(i);
            children[i] = kids.get(i);
            for (int c : children[i]) {
                parent[c] = i;
            }
        }
        return new BranchNoise(o, v, parent, children, rNodes, resistors);
    }

    private static int emit(Network net, List<Byte> ops, List<Double> values, List<int[]> kids, List<Integer> rNodes,
            List<Component> resistors) {
        if (net instanceof Component c) {
            int i = ops.size();
            ops.add(c.kind() == ComponentKind.RESISTOR ? R : c.kind() == ComponentKind.CAPACITOR ? C : L);
            values.add(c.value());
            kids.add(new int[0]);
            if (c.kind() == ComponentKind.RESISTOR) {
                rNodes.add(i);
                resistors.add(c);
            }
            return i;
        }
        List<Network> parts = net instanceof Series s ? s.parts() : ((Parallel) net).parts();
        int[] k = new int[parts.size()];
        for (int j = 0; j < k.length; j++) {
            k[j] = emit(parts.get(j), ops, values, kids, rNodes, resistors);
        }
        int i = ops.size();
        ops.add(net instanceof Series ? SERIES : PARALLEL);
        values.add(0.0);
        kids.add(k);
        return i;
    }

    /** Number of tree nodes: the length of the scratch arrays. */
    int size() {
        return op.length;
    }

    int resistorCount() {
        return resistorNode.length;
    }

    String resistorDesignator(int k) {
        return resistorDesignator[k];
    }

    double resistorOhms(int k) {
        return resistorOhms[k];
    }

    /**
     * Evaluates at angular frequency ω (rad/s, &gt; 0): {@code zRe/zIm} get every tree node's
     * impedance (Ω; the branch's own is at index {@code size()-1}) and {@code gRe/gIm} every tree
     * node's factor G to the branch terminals (dimensionless).
     */
    void evaluate(double omega, double[] zRe, double[] zIm, double[] gRe, double[] gIm) {
        int n = op.length;
        for (int i = 0; i < n; i++) {
            switch (op[i]) {
                case R -> {
                    zRe[i] = value[i];
                    zIm[i] = 0;
                }
                case C -> {
                    zRe[i] = 0;
                    zIm[i] = -1 / (omega * value[i]);
                }
                case L -> {
                    zRe[i] = 0;
                    zIm[i] = omega * value[i];
                }
                case SERIES -> {
                    double sr = 0;
                    double si = 0;
                    for (int c : children[i]) {
                        sr += zRe[c];
                        si += zIm[c];
                    }
                    zRe[i] = sr;
                    zIm[i] = si;
                }
                default -> {
                    double yr = 0;
                    double yi = 0;
                    for (int c : children[i]) {
                        double m = zRe[c] * zRe[c] + zIm[c] * zIm[c];
                        yr += zRe[c] / m;
                        yi -= zIm[c] / m;
                    }
                    double m = yr * yr + yi * yi;
                    zRe[i] = yr / m;
                    zIm[i] = -yi / m;
                }
            }
        }
        gRe[n - 1] = 1;
        gIm[n - 1] = 0;
        for (int i = n - 2; i >= 0; i--) {
            int p = parent[i];
            if (op[p] == SERIES) {
                gRe[i] = gRe[p];
                gIm[i] = gIm[p];
            } else {
                // G_i = G_p · Z_p / Z_i
                double m = zRe[i] * zRe[i] + zIm[i] * zIm[i];
                double qr = (zRe[p] * zRe[i] + zIm[p] * zIm[i]) / m;
                double qi = (zIm[p] * zRe[i] - zRe[p] * zIm[i]) / m;
                gRe[i] = gRe[p] * qr - gIm[p] * qi;
                gIm[i] = gRe[p] * qi + gIm[p] * qr;
            }
        }
    }

    /** Tree index of resistor k, for reading {@code gRe/gIm} after {@link #evaluate}. */
    int resistorNode(int k) {
        return resistorNode[k];
    }
}
