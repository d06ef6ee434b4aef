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
        PartsList.Part c2 = parts.stream().filter(p -> p.designator().equals("C2")).findFirst().orElseThrow();
        // reference: IEC 60063:2015, 3.9 (C2 = 39n) is an E12/E24 value; E48 has 3.83 and 4.02
        assertEquals(List.of(ESeries.E12, ESeries.E24), c2.series());
        assertTrue(c2.advice().contains("C0G"));
        PartsList.Part c3 = parts.stream().filter(p -> p.designator().equals("C3")).findFirst().orElseThrow();
        // reference: IEC 60063:2015, 1.5 (C3 = 15n) is in E6, E12, E24, E96 and E192 (1.50); E48 has 1.47 and 1.54
        assertEquals(List.of(ESeries.E6, ESeries.E12, ESeries.E24, ESeries.E96, ESeries.E192), c3.series());
        assertTrue(r1.advice().contains("metal film"));
    }
}
