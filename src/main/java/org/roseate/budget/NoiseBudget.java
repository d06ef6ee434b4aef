package org.roseate.budget;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import org.roseate.bands.Band;
import org.roseate.bands.BandFraction;
import org.roseate.bands.BandTable;
import org.roseate.circuit.CircuitStage;
import org.roseate.circuit.Design;
import org.roseate.circuit.SourceNoise;
import org.roseate.circuit.Stage;
import org.roseate.model.BandPower;

/**
 * The noise budget of a design in volts. Every stage is solved in its circuit form
 * ({@link Stage#asCircuit()}); stages drive each other through ideal buffers, as everywhere in the
 * project, so the power density at stage s's output is
 * P_s(f) = |H_s(f)|²·P_(s−1)(f) + N_s(f), with P_0 the source's density S(f) = d²(1 + fc/f) and
 * N_s the stage's own noise (resistors and op-amps, uncorrelated so their powers add). Each
 * contributor is carried separately to the output so the budget can rank them.
 *
 * <pre>{@code
 * NoiseBudget b = NoiseBudget.of(design, "design.json");
 * BudgetResult r = b.compute(20, 20000, densityPointsHz, BandFraction.THIRD);
 * }</pre>
 * Not thread-safe (it keeps its solver buffers); build one per thread.
 */
public final class NoiseBudget {
    /** The source's contributor name. */
    public static final String SOURCE = "source";

    private final Design design;
    private final Optional<SourceNoise> source;
    private final double fourKt;
    private final List<StageNoise> stages = new ArrayList<>();
    private final List<String> contributors = new ArrayList<>();
    private final double[] gain2Scratch;
    private final double[][][] ownScratch;
    private double[] perScratch;

    private NoiseBudget(Design design, String sourceName) {
        this.design = design;
        this.source = design.source();
        fourKt = Thermal.fourKt(design.temperatureC());
        contributors.add(SOURCE);
        Map<String, Integer> uses = new HashMap<>();
        List<CircuitStage> circuits = design.stages().stream().map(Stage::asCircuit).toList();
        circuits.forEach(c -> c.opamps().keySet().forEach(u -> uses.merge(u, 1, Integer::sum)));
        int maxWatch = 1;
        for (int s = 0; s < circuits.size(); s++) {
            Map<String, String> labels = new LinkedHashMap<>();
            for (String u : circuits.get(s).opamps().keySet()) {
                labels.put(u, uses.get(u) > 1 ? "stage " + (s + 1) + " " + u : u);
            }
            StageNoise sn = new StageNoise(circuits.get(s), s + 1, sourceName, contributors, labels);
            stages.add(sn);
            maxWatch = Math.max(maxWatch, sn.watchCount());
        }
        gain2Scratch = new double[maxWatch];
        ownScratch = new double[stages.size()][][];
        for (int s = 0; s < stages.size(); s++) {
            ownScratch[s] = new double[stages.get(s).watchCount()][contributors.size()];
        }
    }

    /**
     * Prepares the budget of a design; {@code sourceName} names the file in error messages.
     *
     * @throws org.roseate.circuit.DesignException if a stage's equations cannot be solved
     */
    public static NoiseBudget of(Design design, String sourceName) {
        return new NoiseBudget(design, sourceName);
    }

    public Design design() {
        return design;
    }

    /** Contributor names in evaluation order: {@value #SOURCE}, then each stage's resistors and op-amps. */
    public List<String> contributorNames() {
        return List.copyOf(contributors);
    }

    /**
     * Fills, at {@code hz}, {@code perContributor[c]} with contributor c's density at the output
     * (V²/Hz) and {@code watched[s][w]} with the total density at stage s's watched node w; returns
     * the total output density, V²/Hz.
     */
    double evaluate(double hz, double[] perContributor, double[][] watched) {
        java.util.Arrays.fill(perContributor, 0);
        perContributor[0] = source.map(src -> src.densitySquared(hz)).orElse(0.0);
        double[] g2 = gain2Scratch;
        for (int s = 0; s < stages.size(); s++) {
            StageNoise st = stages.get(s);
            double[][] own = ownScratch[s];
            st.evaluate(hz, fourKt, g2, own);
            double before = 0;
            for (double c : perContributor) {
                before += c;
            }
            // watched nodes other than the output: through this stage only
            if (watched != null) {
                for (int w = 0; w < st.watchCount(); w++) {
                    double p = g2[w] * before;
                    for (double c : own[w]) {
                        p += c;
                    }
                    watched[s][w] = p;
                }
            }
            double h2 = g2[0];
            double[] own0 = own[0];
            for (int c = 0; c < perContributor.length; c++) {
                perContributor[c] = h2 * perContributor[c] + own0[c];
            }
            for (double[] row : own) {
                java.util.Arrays.fill(row, 0);
            }
        }
        double total = 0;
        for (double c : perContributor) {
            total += c;
        }
        return total;
    }

    /** The total output density at {@code hz}, V²/Hz. */
    public double outputDensitySquared(double hz) {
        if (perScratch == null) {
            perScratch = new double[contributors.size()];
        }
        return evaluate(hz, perScratch, null);
    }

    /** At {@code hz}: the output density's source part and the circuit's own part, V²/Hz ({source, self}). */
    public double[] outputDensityParts(double hz) {
        double[] per = new double[contributors.size()];
        double total = evaluate(hz, per, null);
        return new double[] {per[0], total - per[0]};
    }

    /**
     * The budget over [loHz, hiHz] ({@link Quadrature}), the output density at {@code densityHz}
     * and the band levels in bands of {@code fraction} that lie within the range.
     */
    public BudgetResult compute(double loHz, double hiHz, double[] densityHz, BandFraction fraction) {
        Quadrature q = Quadrature.of(loHz, hiHz);
        int nc = contributors.size();
        double[] perC = new double[nc];
        double[][] watched = new double[stages.size()][];
        double[][] watchPower = new double[stages.size()][];
        double[][] watchRate = new double[stages.size()][];
        for (int s = 0; s < stages.size(); s++) {
            int n = stages.get(s).watchCount();
            watched[s] = new double[n];
            watchPower[s] = new double[n];
            watchRate[s] = new double[n];
        }
        double[] cPower = new double[nc];
        double power = 0;
        double rate = 0;
        for (int i = 0; i < q.size(); i++) {
            double f = q.hz()[i];
            double wt = q.weight()[i];
            double w2 = (2 * Math.PI * f) * (2 * Math.PI * f);
            double total = evaluate(f, perC, watched);
            power += wt * total;
            rate += wt * w2 * total;
            for (int c = 0; c < nc; c++) {
                cPower[c] += wt * perC[c];
            }
            for (int s = 0; s < stages.size(); s++) {
                for (int w = 0; w < watched[s].length; w++) {
                    watchPower[s][w] += wt * watched[s][w];
                    watchRate[s][w] += wt * w2 * watched[s][w];
                }
            }
        }
        List<BudgetResult.DensityPoint> density = new ArrayList<>();
        for (double f : densityHz) {
            density.add(new BudgetResult.DensityPoint(f, Math.sqrt(outputDensitySquared(f))));
        }
        List<BudgetResult.BandLevel> bands = new ArrayList<>();
        for (Band b : BandTable.of(fraction, loHz, hiHz).bands()) {
            double p = BandPower.integrate(this::outputDensitySquared, b.lowHz(), b.highHz());
            bands.add(new BudgetResult.BandLevel(b.nominalHz(), b.lowHz(), b.highHz(), 10 * Math.log10(p)));
        }
        List<BudgetResult.StageReading> readings = new ArrayList<>();
        for (int s = 0; s < stages.size(); s++) {
            StageNoise st = stages.get(s);
            for (int w = 0; w < st.watchCount(); w++) {
                var lim = Optional.ofNullable(st.watchLimits[w]);
                readings.add(new BudgetResult.StageReading(s + 1, st.watchNodes[w], Optional.ofNullable(st.watchOpamp[w]),
                        Math.sqrt(watchPower[s][w]), lim.filter(l -> l.hasSwing()).map(l -> l.swingV()),
                        Math.sqrt(watchRate[s][w]) * 1e-6, lim.filter(l -> l.hasSlew()).map(l -> l.slewVPerUs())));
            }
        }
        List<BudgetResult.Contributor> ranked = new ArrayList<>();
        double self = 0;
        for (int c = 0; c < nc; c++) {
            if (c == 0 && source.isEmpty()) {
                continue;
            }
            ranked.add(new BudgetResult.Contributor(contributors.get(c), Math.sqrt(cPower[c])));
            if (c > 0) {
                self += cPower[c];
            }
        }
        ranked.sort(Comparator.comparingDouble(BudgetResult.Contributor::rmsV).reversed());
        return new BudgetResult(loHz, hiHz, design.temperatureC(), source.isPresent(), Math.sqrt(power), Math.sqrt(cPower[0]),
                Math.sqrt(self), Math.sqrt(rate), Gaussian.zeroCrossingsPerS(power, rate), density, bands, readings, ranked,
                q.size());
    }
}
