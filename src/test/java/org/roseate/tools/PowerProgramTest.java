package org.roseate.tools;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.stream.Stream;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;
import org.roseate.bands.BandFraction;
import org.roseate.bands.BandTable;
import org.roseate.circuit.Design;
import org.roseate.circuit.DesignReader;
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
}
