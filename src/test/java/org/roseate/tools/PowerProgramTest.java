package org.roseate.tools;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.SplittableRandom;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;
import org.roseate.bands.BandFraction;
import org.roseate.bands.BandTable;
import org.roseate.circuit.Design;
import org.roseate.circuit.DesignReader;
import org.roseate.circuit.OpAmp;
import org.roseate.compare.DesignAnalysis;
import org.roseate.compare.FrequencyRange;
import org.roseate.compare.TargetSlope;
import org.roseate.model.CircuitModel;

/** The tools' fast evaluator against the model package's exact evaluation (an independent implementation). */
class PowerProgramTest {
    static Stream<Path> presets() throws Exception {
        return Files.list(Path.of("presets")).filter(p -> p.toString().endsWith(".json")).sorted();
    }

    @ParameterizedTest
    @MethodSource("presets")
    void powerAgreesWithCircuitModel(Path preset) {
        Design d = DesignReader.read(preset);
        CircuitModel m = CircuitModel.of(d, "p");
        PowerProgram p = PowerProgram.of(d);
        PowerProgram.Workspace w = p.workspace();
        p.load(p.nominal(), w);
        for (double hz : new double[] {0.5, 3, 20, 97.3, 1000, 4321, 20000, 96000}) {
            double expected = m.magnitudeSquared(hz);
            // reference: CircuitModel (ImpedanceProgram + StageModel); 1e-11 relative allows the different
            // order of the same floating-point operations.
            assertEquals(expected, p.power(2 * Math.PI * hz, w), 1e-11 * expected, preset + " at " + hz + " Hz");
        }
    }

    @ParameterizedTest
    @MethodSource("presets")
    void scorerReproducesDesignAnalysis(Path preset) {
        Design d = DesignReader.read(preset);
        FrequencyRange r = new FrequencyRange(20, 20000);
        for (BandFraction f : BandFraction.values()) {
            DesignAnalysis a = DesignAnalysis.of(CircuitModel.of(d, "p"), r, TargetSlope.PINK, f, new double[] {1000});
            Scorer s = new Scorer(PowerProgram.of(d), r, TargetSlope.PINK, BandTable.of(f, 20, 20000));
            Scorer.Workspace w = s.workspace();
            double[] levels = new double[s.bandCount()];
            s.bandLevels(s.program().nominal(), w, levels);
            for (int i = 0; i < levels.length; i++) {
                // reference: BandPower.levelDb through CircuitModel; same nodes, summed in another order
                assertEquals(a.bands().readings().get(i).levelDb(), levels[i], 1e-10);
            }
            assertEquals(a.bands().maxBandDeviationDb(), s.bandPeakDb(s.program().nominal(), w), 1e-10);
            assertEquals(a.slope().maxDeviationDb(), s.pointPeakDb(s.program().nominal(), w), 1e-10);
        }
    }

    /**
     * The batch evaluation against the per-frequency one: the same operations in the same order,
     * so every value must be bitwise equal (tolerance 0, not a rounding bound), with drawn part
     * values (±30 %) and op-amp gbwHz factors, over a frequency count that leaves a partial block.
     */
    @ParameterizedTest
    @MethodSource("presets")
    void batchPowersEqualPowerBitwise(Path preset) {
        assertBatchEqualsScalar(DesignReader.read(preset), preset.toString());
    }

    @Test
    void batchPowersEqualPowerBitwiseOnFitTopologies() {
        FrequencyRange r = new FrequencyRange(20, 20000);
        PartLimits limits = PartLimits.DEFAULT;
        for (int branches : new int[] {1, 4, 12}) {
            assertBatchEqualsScalar(Topologies.invertingLadder(branches, OptionalDouble.empty(),
                    Optional.of(OpAmp.singlePole(1e6)), limits, r), "inverting " + branches);
            assertBatchEqualsScalar(Topologies.invertingLadder(branches, OptionalDouble.of(10e3),
                    Optional.empty(), limits, r), "inverting ideal " + branches);
            assertBatchEqualsScalar(Topologies.dividerLadder(branches, OptionalDouble.of(1e6), limits, r),
                    "divider loaded " + branches);
            assertBatchEqualsScalar(Topologies.dividerLadder(branches, OptionalDouble.empty(), limits, r),
                    "divider " + branches);
        }
    }

    private static void assertBatchEqualsScalar(Design d, String what) {
        PowerProgram p = PowerProgram.of(d);
        int n = 2 * PowerProgram.BLOCK + 37;
        double[] omega = new double[n];
        for (int i = 0; i < n; i++) {
            // 0.1 Hz to 200 kHz, log-spaced
            omega[i] = 2 * Math.PI * 0.1 * Math.pow(2e6, (double) i / (n - 1));
        }
        PowerProgram.Frequencies f = new PowerProgram.Frequencies(omega);
        PowerProgram.Workspace batch = p.workspace();
        PowerProgram.Workspace scalar = p.workspace();
        double[] out = new double[n];
        SplittableRandom rnd = new SplittableRandom(17);
        double[] nominal = p.nominal();
        for (int trial = 0; trial < 5; trial++) {
            double[] v = nominal.clone();
            if (trial > 0) {
                for (int i = 0; i < v.length; i++) {
                    v[i] *= 1 + 0.3 * (2 * rnd.nextDouble() - 1);
                }
                for (int s = 0; s < p.stageCount(); s++) {
                    double g = 0.5 + rnd.nextDouble();
                    if (p.hasOpAmp(s)) {
                        PowerProgram.setGbwFactor(s, -1, g, batch);
                        PowerProgram.setGbwFactor(s, -1, g, scalar);
                    }
                    for (OpAmpAt o : circuitOpAmps(p, d, s)) {
                        PowerProgram.setGbwFactor(s, o.k, g, batch);
                        PowerProgram.setGbwFactor(s, o.k, g, scalar);
                    }
                }
            }
            p.load(v, batch);
            p.load(v, scalar);
            p.powers(f, batch, out);
            for (int i = 0; i < n; i++) {
                double expected = p.power(omega[i], scalar);
                assertEquals(Double.doubleToRawLongBits(expected), Double.doubleToRawLongBits(out[i]),
                        what + " trial " + trial + " at ω " + omega[i] + ": " + expected + " vs " + out[i]);
            }
        }
    }

    private record OpAmpAt(int k) {
    }

    private static List<OpAmpAt> circuitOpAmps(PowerProgram p, Design d, int s) {
        return PartsList.opAmps(d).stream().filter(o -> o.stage() - 1 == s)
                .map(o -> new OpAmpAt(p.circuitOpAmpIndex(s, o.name()))).filter(o -> o.k >= 0).toList();
    }
}
