package org.roseate.budget;

import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.roseate.circuit.CircuitOpAmp;
import org.roseate.circuit.CircuitStage;
import org.roseate.circuit.OpAmp;
import org.roseate.model.NodalModel;
import org.roseate.model.NodalSolver;

/**
 * One stage's noise generators and its transfer to the watched nodes (the stage's output, then the
 * output of every other op-amp in the stage), at one frequency at a time.
 *
 * <p>Per frequency: one LU of the nodal matrix, one forward solve (the node voltages per volt at
 * the stage's input) and one adjoint solve per watched node (the transimpedance from every node to
 * it, by the adjoint method: {@link NodalSolver#solveAdjoint}). The generators:
 * <ul>
 * <li>each resistor: 4kTR in series with it, carried to its branch's terminals as in
 *     {@link BranchNoise}, then as a Norton current through the adjoint;</li>
 * <li>each op-amp's voltage noise: a source in series with its + input (row of the adjoint);</li>
 * <li>each op-amp's current noise: a current from gnd into each input pin, the two uncorrelated.</li>
 * </ul>
 * A current into the stage's input node, which an ideal source (the previous stage's buffered
 * output, or the noise source) holds, makes no voltage. Not thread-safe: one instance per thread.
 */
final class StageNoise {
    final int number;
    final CircuitStage circuit;
    private final NodalSolver solver;
    private final NodalSolver[] watchSolvers;
    final String[] watchNodes;
    /** The op-amp driving each watched node, or null (a passive stage's output). */
    final String[] watchOpamp;
    final OpAmp.Noise[] watchLimits;
    private final int[] watchIndex;
    private final BranchNoise[] branches;
    private final int[] branchP;
    private final int[] branchQ;
    /** Global contributor index of each resistor, per branch. */
    private final int[][] resistorContributor;
    private final int[] opRow;
    private final int[] opPlus;
    private final int[] opMinus;
    private final OpAmp.Noise[] opNoise;
    private final int[] opEnContributor;
    private final int[] opInContributor;
    private final NodalSolver.Workspace ws;
    private final double[][] adjRe;
    private final double[][] adjIm;
    private final double[][] zRe;
    private final double[][] zIm;
    private final double[][] gRe;
    private final double[][] gIm;

    /**
     * @param contributors the design's contributor names so far; this stage's are appended
     * @param opampLabel   the name of each op-amp designator in contributor names
     */
    StageNoise(CircuitStage circuit, int number, String source, List<String> contributors, Map<String, String> opampLabel) {
        this.number = number;
        this.circuit = circuit;
        NodalModel model = NodalModel.of(circuit, number, source);
        solver = model.solver();
        List<String> nodes = solver.nodeNames();
        List<String> watched = new ArrayList<>();
        watched.add(circuit.output());
        for (CircuitOpAmp op : circuit.opamps().values()) {
            if (!watched.contains(op.output())) {
                watched.add(op.output());
            }
        }
        watchNodes = watched.toArray(String[]::new);
        watchSolvers = new NodalSolver[watchNodes.length];
        watchOpamp = new String[watchNodes.length];
        watchLimits = new OpAmp.Noise[watchNodes.length];
        watchIndex = new int[watchNodes.length];
        for (int w = 0; w < watchNodes.length; w++) {
            watchSolvers[w] = w == 0 ? solver
                    : NodalSolver.of(new CircuitStage(circuit.input(), watchNodes[w], circuit.branches(), circuit.opamps()));
            watchIndex[w] = nodes.indexOf(watchNodes[w]);
            for (Map.Entry<String, CircuitOpAmp> e : circuit.opamps().entrySet()) {
                if (e.getValue().output().equals(watchNodes[w])) {
                    watchOpamp[w] = e.getKey();
                    watchLimits[w] = e.getValue().model().noise();
                }
            }
        }
        List<String> keys = solver.branchKeys();
        branches = new BranchNoise[keys.size()];
        branchP = new int[keys.size()];
        branchQ = new int[keys.size()];
        resistorContributor = new int[keys.size()][];
        zRe = new double[keys.size()][];
        zIm = new double[keys.size()][];
        gRe = new double[keys.size()][];
        gIm = new double[keys.size()][];
        for (int b = 0; b < keys.size(); b++) {
            branches[b] = BranchNoise.compile(circuit.branches().get(keys.get(b)));
            String[] pq = keys.get(b).split(" ");
            branchP[b] = nodes.indexOf(pq[0]);
            branchQ[b] = nodes.indexOf(pq[1]);
            resistorContributor[b] = new int[branches[b].resistorCount()];
            for (int k = 0; k < resistorContributor[b].length; k++) {
                resistorContributor[b][k] = contributors.size();
                contributors.add(branches[b].resistorDesignator(k));
            }
            int n = branches[b].size();
            zRe[b] = new double[n];
            zIm[b] = new double[n];
            gRe[b] = new double[n];
            gIm[b] = new double[n];
        }
        List<String> ops = solver.opampNames();
        opRow = new int[ops.size()];
        opPlus = new int[ops.size()];
        opMinus = new int[ops.size()];
        opNoise = new OpAmp.Noise[ops.size()];
        opEnContributor = new int[ops.size()];
        opInContributor = new int[ops.size()];
        for (int k = 0; k < ops.size(); k++) {
            CircuitOpAmp op = circuit.opamps().get(ops.get(k));
            opRow[k] = nodes.size() + k;
            opPlus[k] = nodes.indexOf(op.plus());
            opMinus[k] = nodes.indexOf(op.minus());
            opNoise[k] = op.model().noise();
            String label = opampLabel.getOrDefault(ops.get(k), ops.get(k));
            opEnContributor[k] = -1;
            opInContributor[k] = -1;
            if (opNoise[k].enVPerRtHz() > 0) {
                opEnContributor[k] = contributors.size();
                contributors.add(label + " en");
            }
            if (opNoise[k].inAPerRtHz() > 0) {
                opInContributor[k] = contributors.size();
                contributors.add(label + " in");
            }
        }
        ws = solver.workspace();
        adjRe = new double[watchNodes.length][solver.size()];
        adjIm = new double[watchNodes.length][solver.size()];
    }

    int watchCount() {
        return watchNodes.length;
    }

    /**
     * At {@code hz}: {@code gain2[w]} gets |v_w / v_in|² for each watched node, and
     * {@code own[w][c]} the power density (V²/Hz) of this stage's contributor c at watched node w
     * (other entries untouched).
     *
     * @param fourKt 4kT at the circuit's temperature, J
     */
    void evaluate(double hz, double fourKt, double[] gain2, double[][] own) {
        double omega = 2 * Math.PI * hz;
        for (int b = 0; b < branches.length; b++) {
            branches[b].evaluate(omega, zRe[b], zIm[b], gRe[b], gIm[b]);
            int root = branches[b].size() - 1;
            double m = NodalSolver.REFERENCE_OHMS / (zRe[b][root] * zRe[b][root] + zIm[b][root] * zIm[b][root]);
            ws.yRe[b] = zRe[b][root] * m;
            ws.yIm[b] = -zIm[b][root] * m;
        }
        solver.factor(0, omega, ws);
        solver.solve(ws);
        for (int w = 0; w < watchNodes.length; w++) {
            int i = watchIndex[w];
            gain2[w] = i >= 0 ? ws.xRe[i] * ws.xRe[i] + ws.xIm[i] * ws.xIm[i] : watchNodes[w].equals(circuit.input()) ? 1 : 0;
            watchSolvers[w].solveAdjoint(ws);
            System.arraycopy(ws.adjRe, 0, adjRe[w], 0, adjRe[w].length);
            System.arraycopy(ws.adjIm, 0, adjIm[w], 0, adjIm[w].length);
        }
        double r0 = NodalSolver.REFERENCE_OHMS;
        for (int w = 0; w < watchNodes.length; w++) {
            double[] ar = adjRe[w];
            double[] ai = adjIm[w];
            double[] out = own[w];
            for (int b = 0; b < branches.length; b++) {
                int p = branchP[b];
                int q = branchQ[b];
                // transimpedance R0·(a_p − a_q), Ω
                double tr = r0 * ((p >= 0 ? ar[p] : 0) - (q >= 0 ? ar[q] : 0));
                double ti = r0 * ((p >= 0 ? ai[p] : 0) - (q >= 0 ? ai[q] : 0));
                int root = branches[b].size() - 1;
                double zr = zRe[b][root];
                double zi = zIm[b][root];
                // |T / Z_b|²
                double t2 = (tr * tr + ti * ti) / (zr * zr + zi * zi);
                BranchNoise bn = branches[b];
                for (int k = 0; k < bn.resistorCount(); k++) {
                    int node = bn.resistorNode(k);
                    double g2 = gRe[b][node] * gRe[b][node] + gIm[b][node] * gIm[b][node];
                    out[resistorContributor[b][k]] = fourKt * bn.resistorOhms(k) * g2 * t2;
                }
            }
            for (int k = 0; k < opRow.length; k++) {
                OpAmp.Noise n = opNoise[k];
                if (opEnContributor[k] >= 0) {
                    int r = opRow[k];
                    out[opEnContributor[k]] = (ar[r] * ar[r] + ai[r] * ai[r]) * n.voltageDensitySquared(hz);
                }
                if (opInContributor[k] >= 0) {
                    int p = opPlus[k];
                    int m = opMinus[k];
                    double tp = p >= 0 ? ar[p] * ar[p] + ai[p] * ai[p] : 0;
                    double tm = m >= 0 ? ar[m] * ar[m] + ai[m] * ai[m] : 0;
                    out[opInContributor[k]] = r0 * r0 * (tp + tm) * n.currentDensitySquared(hz);
                }
            }
        }
    }
}
