package org.roseate.budget;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.roseate.circuit.CircuitStage;
import org.roseate.circuit.Design;
import org.roseate.circuit.DesignReader;
import org.roseate.circuit.DesignWriter;
import org.roseate.circuit.OpAmp;

/** The file keys are read as documented and written back unchanged. */
class DesignKeysTest {

    @Test
    void sourceTemperatureAndOpampKeysAreReadAndWrittenBack() {
        Design d = DesignReader.read(Path.of("src/test/resources/reference/budget/reference-b.json"));
        assertEquals(50e-6, d.source().orElseThrow().densityVPerRtHz());
        assertEquals(1000, d.source().orElseThrow().flickerCornerHz());
        assertEquals(Design.DEFAULT_TEMPERATURE_C, d.temperatureC());
        OpAmp.Noise u1 = ((CircuitStage) d.stages().get(0)).opamps().get("U1").model().noise();
        assertEquals(new OpAmp.Noise(5e-9, 0.5e-12, 50, 100, 12, 13), u1);
        OpAmp.Noise u2 = ((CircuitStage) d.stages().get(0)).opamps().get("U2").model().noise();
        assertTrue(((CircuitStage) d.stages().get(0)).opamps().get("U2").model().isIdeal());
        assertEquals(20e-9, u2.enVPerRtHz());
        assertTrue(!u2.hasSlew());
        Design back = DesignReader.parse(DesignWriter.toJson(d), "back");
        assertEquals(d, back);
        Design a = DesignReader.read(Path.of("src/test/resources/reference/budget/reference-a.json"));
        assertEquals(40, a.temperatureC());
        assertEquals(a, DesignReader.parse(DesignWriter.toJson(a), "back"));
    }

    @Test
    void anOlderKindsOpampMayGiveNoiseWithoutGbw() {
        Design d = BudgetFixtures.inverting("1k", "2k", "\"enVPerRtHz\": 4e-9", "");
        OpAmp op = d.stages().get(0).opamp().orElseThrow();
        assertTrue(op.isIdeal());
        assertEquals(4e-9, op.noise().enVPerRtHz());
        assertEquals(d, DesignReader.parse(DesignWriter.toJson(d), "back"));
    }
}
