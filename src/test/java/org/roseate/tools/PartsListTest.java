package org.roseate.tools;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.roseate.circuit.DesignReader;
import org.roseate.value.ESeries;

class PartsListTest {
    @Test
    void benchPresetParts() {
        List<PartsList.Part> parts = PartsList.of(DesignReader.read(Path.of("presets/bench-pink.json")));
        assertEquals(9, parts.size());
        PartsList.Part r1 = parts.get(0);
        assertEquals("R1", r1.designator());
        assertEquals("47k", r1.letterCode());
        assertEquals("47 kΩ", r1.si());
        // reference: IEC 60063:2015 tables: 4.7 is in E3, E6, E12, E24 and E192 (4.70), not in E48/E96 (4.75)
        assertEquals(List.of(ESeries.E3, ESeries.E6, ESeries.E12, ESeries.E24, ESeries.E192), r1.series());
        assertEquals("1%", r1.tolerance().orElseThrow().toString());
        PartsList.Part c3 = parts.stream().filter(p -> p.designator().equals("C3")).findFirst().orElseThrow();
        // reference: IEC 60063:2015, 3.9 is an E12/E24 value; E48 has 3.83 and 4.02
        assertEquals(List.of(ESeries.E12, ESeries.E24), c3.series());
        assertTrue(c3.advice().contains("C0G"));
        assertTrue(r1.advice().contains("metal film"));
    }
}
