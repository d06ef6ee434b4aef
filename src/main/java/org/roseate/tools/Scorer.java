package org.roseate.tools;

import java.util.List;
import java.util.function.DoubleUnaryOperator;
import org.roseate.bands.Band;
import org.roseate.bands.BandTable;
import org.roseate.compare.FrequencyRange;
import org.roseate.compare.LogGrid;
import org.roseate.compare.SlopeFit;
import org.roseate.compare.TargetSlope;

/**
 * The deviation measures of {@link org.roseate.compare.DesignAnalysis} on a fixed frequency set,
 * for a {@link PowerProgram}: band levels 10·log10 ∫|H|² df by the same composite 8-point
 * Gauss–Legendre rule on ln f as {@link org.roseate.model.BandPower} (Abramowitz &amp; Stegun
 * table 25.4, sub-intervals ≤ 0.05 in ln f; nodes precomputed here once), and the pointwise
 * deviation on the {@link SlopeFit} grid ({@value SlopeFit#POINTS_PER_DECADE} per decade). Both
 * centred by the minimax offset, peak = (max − min)/2. With a source shape s(f) (the relative
 * density 1 + fc/f of {@link org.roseate.circuit.SourceNoise}) the judged power is |H|²·s, as in
 * {@link org.roseate.compare.DesignAnalysis#withSource}: each quadrature weight is multiplied by s at
 * its node, and 10·log10 s is subtracted from each pointwise target. Immutable; thread-safe with one
 * {@link Workspace} per thread.
 */
final class Scorer {
    private static final double[] NODES = {
        0.1834346424956498, 0.5255324099163290, 0.7966664774136267, 0.9602898564975363,
    };
    private static final double[] WEIGHTS = {
        0.3626837833783620, 0.3137066458778873, 0.2223810344533745, 0.1012285362903763,
    };
    private static final double MAX_STEP_LN = 0.05;
    private static final double DB_PER_NEPER_POWER = 10 / Math.log(10);

    private final PowerProgram program;
    private final BandTable table;
    private final double[] bandOmega;
    private final double[] bandWeightHz;
    /** Node range of band i: bandStart[i] … bandStart[i + 1] − 1. */
    private final int[] bandStart;
    private final double[] targetBandDb;
    private final double[] pointOmega;
    private final double[] targetPointDb;
    /** bandOmega and pointOmega with 1/ω hoisted, for the batch evaluation. */
    private final PowerProgram.Frequencies bandFrequencies;
    private final PowerProgram.Frequencies pointFrequencies;

    Scorer(PowerProgram program, FrequencyRange range, TargetSlope target, BandTable table) {
        this(program, range, target, table, hz -> 1.0);
    }

    /** @param sourceShape the source's relative density s(f) &gt; 0, f in Hz, multiplying |H|² */
    Scorer(PowerProgram program, FrequencyRange range, TargetSlope target, BandTable table, DoubleUnaryOperator sourceShape) {
        this.program = program;
        this.table = table;
        List<Band> bands = table.bands();
        int total = 0;
        bandStart = new int[bands.size() + 1];
        for (int i = 0; i < bands.size(); i++) {
            bandStart[i] = total;
            total += 2 * NODES.length * subIntervals(bands.get(i));
        }
        bandStart[bands.size()] = total;
        bandOmega = new double[total];
        bandWeightHz = new double[total];
        targetBandDb = new double[bands.size()];
        int j = 0;
        for (int i = 0; i < bands.size(); i++) {
            Band b = bands.get(i);
            targetBandDb[i] = 10 * Math.log10(target.bandPower(b.lowHz(), b.highHz()));
            double a = Math.log(b.lowHz());
            int m = subIntervals(b);
            double h = (Math.log(b.highHz()) - a) / m;
            double half = 0.5 * h;
            for (int k = 0; k < m; k++) {
                double mid = a + (k + 0.5) * h;
                for (int q = 0; q < NODES.length; q++) {
                    for (int sign = -1; sign <= 1; sign += 2) {
                        double f = Math.exp(mid + sign * half * NODES[q]);
                        bandOmega[j] = 2 * Math.PI * f;
                        bandWeightHz[j] = WEIGHTS[q] * half * f * sourceShape.applyAsDouble(f);
                        j++;
                    }
                }
            }
        }
        double[] grid = LogGrid.points(range.loHz(), range.hiHz(), SlopeFit.POINTS_PER_DECADE);
        pointOmega = new double[grid.length];
        targetPointDb = new double[grid.length];
        for (int i = 0; i < grid.length; i++) {
            pointOmega[i] = 2 * Math.PI * grid[i];
            targetPointDb[i] = target.levelDb(grid[i]) - 10 * Math.log10(sourceShape.applyAsDouble(grid[i]));
        }
        bandFrequencies = new PowerProgram.Frequencies(bandOmega);
        pointFrequencies = new PowerProgram.Frequencies(pointOmega);
    }

    private static int subIntervals(Band b) {
        return Math.max(1, (int) Math.ceil((Math.log(b.highHz()) - Math.log(b.lowHz())) / MAX_STEP_LN));
    }

    PowerProgram program() {
        return program;
    }

    BandTable table() {
        return table;
    }

    int bandCount() {
        return targetBandDb.length;
    }

    /** Band levels (dB) into {@code out}, length ≥ {@link #bandCount()}. */
    void bandLevels(double[] values, Workspace w, double[] out) {
        program.load(values, w.power);
        double[] power = w.powerAtNode();
        program.powers(bandFrequencies, w.power, power);
        for (int i = 0; i < targetBandDb.length; i++) {
            double sum = 0;
            for (int k = bandStart[i]; k < bandStart[i + 1]; k++) {
                sum += bandWeightHz[k] * power[k];
            }
            out[i] = DB_PER_NEPER_POWER * Math.log(sum);
        }
    }

    /** Band levels minus the target's band levels (uncentred), dB, into {@code out}. */
    void bandRaw(double[] values, Workspace w, double[] out) {
        bandLevels(values, w, out);
        for (int i = 0; i < targetBandDb.length; i++) {
            out[i] -= targetBandDb[i];
        }
    }

    /** The centred band peak deviation (maxBandDeviationDb), dB. */
    double bandPeakDb(double[] values, Workspace w) {
        bandRaw(values, w, w.bands);
        return halfSpread(w.bands, targetBandDb.length);
    }

    /** The centred pointwise peak deviation (maxDeviationDb), dB. */
    double pointPeakDb(double[] values, Workspace w) {
        program.load(values, w.power);
        double[] power = w.powerAtNode();
        program.powers(pointFrequencies, w.power, power);
        double max = Double.NEGATIVE_INFINITY;
        double min = Double.POSITIVE_INFINITY;
        for (int i = 0; i < pointOmega.length; i++) {
            double d = DB_PER_NEPER_POWER * Math.log(power[i]) - targetPointDb[i];
            max = Math.max(max, d);
            min = Math.min(min, d);
        }
        return (max - min) / 2;
    }

    static double halfSpread(double[] v, int n) {
        double max = Double.NEGATIVE_INFINITY;
        double min = Double.POSITIVE_INFINITY;
        for (int i = 0; i < n; i++) {
            max = Math.max(max, v[i]);
            min = Math.min(min, v[i]);
        }
        return (max - min) / 2;
    }

    Workspace workspace() {
        return new Workspace(program.workspace(), new double[targetBandDb.length],
                new double[Math.max(bandOmega.length, pointOmega.length)]);
    }

    /** Per-thread scratch: the program's, the band deviations, and |H|² at each node or point. */
    record Workspace(PowerProgram.Workspace power, double[] bands, double[] powerAtNode) {
    }
}
