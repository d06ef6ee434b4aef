package org.roseate.circuit;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

class DesignReaderTest {
    private static final String GOOD = """
            {"name": "t", "description": "d",
             "tolerance": {"R": "1%", "C3": "2%"},
             "stages": [
               {"kind": "inverting", "input": "R1(10k)", "feedback": "R2(100k) || C1(10n)",
                "opamp": {"gbwHz": 1e6}},
               {"kind": "noninverting", "ground": "R3(1k)", "feedback": "R4(9k1)"},
               {"kind": "divider", "series": "R5(10k)", "shunt": "C3(100n)", "load": "R6(1M)"}
             ]}""";

    @Test
    void readsAllStageKinds() {
        Design d = DesignReader.parse(GOOD, "t.json");
        assertEquals(3, d.stages().size());
        InvertingStage s = (InvertingStage) d.stages().get(0);
        assertEquals(1e6, s.opamp().orElseThrow().gbwHz());
        assertEquals(OpAmp.DEFAULT_OPEN_LOOP_GAIN, s.opamp().orElseThrow().openLoopGain());
        assertTrue(d.stages().get(1).opamp().isEmpty());
        DividerStage dv = (DividerStage) d.stages().get(2);
        assertTrue(dv.load().isPresent());
        assertEquals(0.02, d.toleranceOf(d.component("C3").orElseThrow()).orElseThrow().fraction(), 1e-12);
        assertEquals(0.01, d.toleranceOf(d.component("R5").orElseThrow()).orElseThrow().fraction(), 1e-12);
        assertTrue(d.toleranceOf(d.component("C1").orElseThrow()).isEmpty());
    }

    @Test
    void writerOutputReadsBackEqual() {
        Design d = DesignReader.parse(GOOD, "t.json");
        Design again = DesignReader.parse(DesignWriter.toJson(d), "again.json");
        assertEquals(d, again);
    }

    @Test
    void editsReturnNewDesigns() {
        Design d = DesignReader.parse(GOOD, "t.json");
        Design e = d.withValue("R2", 120e3);
        assertEquals(100e3, d.component("R2").orElseThrow().value());
        assertEquals(120e3, e.component("R2").orElseThrow().value());
    }

    /** Every malformed case: one line, names the file and place, says what was expected. */
    @ParameterizedTest
    @CsvSource(delimiter = ';', value = {
        "{\"name\": \"x\", \"stages\": [ } ; d.json: invalid JSON at line 1, column",
        "[1, 2] ; d.json: expected a JSON object",
        "'' ; d.json: empty file",
        "{\"name\": \"x\"} ; d.json: missing key 'stages'",
        "{\"stages\": []} ; d.json: missing key 'name'",
        "{\"name\": \"x\", \"stages\": []} ; d.json: 'stages' is empty",
        "{\"name\": \"x\", \"stages\": {}} ; d.json: 'stages' must be a list",
        "{\"name\": \"x\", \"stages\": [{\"kind\": \"bandpass\"}]} ; d.json: stage 1: unknown kind 'bandpass'; expected inverting, noninverting, divider or circuit",
        "{\"name\": \"x\", \"stages\": [{\"input\": \"R1(1k)\"}]} ; d.json: stage 1: missing key 'kind'",
        "{\"name\": \"x\", \"stages\": [{\"kind\": \"inverting\", \"input\": \"R1(1k)\"}]} ; d.json: stage 1 (inverting): missing key 'feedback'",
        "{\"name\": \"x\", \"stages\": [{\"kind\": \"inverting\", \"input\": \"R1(1k)\", \"feedbak\": \"R2(1k)\"}]} ; d.json: stage 1 (inverting): unknown key 'feedbak'",
        "{\"name\": \"x\", \"stages\": [{\"kind\": \"inverting\", \"input\": \"R1(1k)\", \"feedback\": \"R2(10k) + R3(4kk7)\"}]} ; d.json: stage 1 feedback, column 14: expected a value such as 4k7 or 22n, found '4kk7'",
        "{\"name\": \"x\", \"stages\": [{\"kind\": \"inverting\", \"input\": \"Q1(1k)\", \"feedback\": \"R2(1k)\"}]} ; d.json: stage 1 input, column 1: unknown designator letter 'Q'",
        "{\"name\": \"x\", \"stages\": [{\"kind\": \"inverting\", \"input\": \"R1(0)\", \"feedback\": \"R2(1k)\"}]} ; d.json: stage 1 input, column 4:",
        "{\"name\": \"x\", \"stages\": [{\"kind\": \"inverting\", \"input\": \"R1(-1k)\", \"feedback\": \"R2(1k)\"}]} ; d.json: stage 1 input, column 4:",
        "{\"name\": \"x\", \"stages\": [{\"kind\": \"inverting\", \"input\": \"R1(inf)\", \"feedback\": \"R2(1k)\"}]} ; d.json: stage 1 input, column 4:",
        "{\"name\": \"x\", \"stages\": [{\"kind\": \"inverting\", \"input\": \"(R1(1k)\", \"feedback\": \"R2(1k)\"}]} ; d.json: stage 1 input, column 1: unbalanced parentheses",
        "{\"name\": \"x\", \"stages\": [{\"kind\": \"inverting\", \"input\": \"R1(1k) + R3(1k) || R4(1k)\", \"feedback\": \"R2(1k)\"}]} ; d.json: stage 1 input, column 17: '+' and '||' mixed",
        "{\"name\": \"x\", \"stages\": [{\"kind\": \"inverting\", \"input\": \"\", \"feedback\": \"R2(1k)\"}]} ; d.json: stage 1 input, column 1: empty network",
        "{\"name\": \"x\", \"stages\": [{\"kind\": \"inverting\", \"input\": 12, \"feedback\": \"R2(1k)\"}]} ; d.json: stage 1 input: expected a network such as",
        "{\"name\": \"x\", \"stages\": [{\"kind\": \"inverting\", \"input\": \"R1(1k)\", \"feedback\": \"R1(2k)\"}]} ; d.json: designator R1 is used twice (stage 1 input and stage 1 feedback)",
        "{\"name\": \"x\", \"stages\": [{\"kind\": \"inverting\", \"input\": \"R1(1k)\", \"feedback\": \"R2(1k)\", \"opamp\": {\"gbwHz\": -5}}]} ; d.json: stage 1 opamp gbwHz: must be a finite number > 0",
        "{\"name\": \"x\", \"stages\": [{\"kind\": \"inverting\", \"input\": \"R1(1k)\", \"feedback\": \"R2(1k)\", \"opamp\": {\"openLoopGain\": 1e5}}]} ; d.json: stage 1 opamp: missing key 'gbwHz'",
        "{\"name\": \"x\", \"stages\": [{\"kind\": \"divider\", \"series\": \"R1(1k)\", \"shunt\": \"R2(1k)\", \"opamp\": {\"gbwHz\": 1e6}}]} ; d.json: stage 1 (divider): unknown key 'opamp'",
        "{\"name\": \"x\", \"tolerance\": {\"Q\": \"1%\"}, \"stages\": [{\"kind\": \"divider\", \"series\": \"R1(1k)\", \"shunt\": \"R2(1k)\"}]} ; d.json: tolerance: unknown key 'Q'",
        "{\"name\": \"x\", \"name\": \"y\", \"stages\": []} ; d.json: key 'name' appears twice (line 1, column",
    })
    void malformedDesigns(String json, String expectedStart) {
        DesignException e = assertThrows(DesignException.class, () -> DesignReader.parse(json, "d.json"));
        assertTrue(e.getMessage().startsWith(expectedStart), e.getMessage());
        assertFalse(e.getMessage().contains("\n"), "one line: " + e.getMessage());
    }

    @Test
    void networkErrorsCarryStageRoleAndColumnForEditors() {
        String json = "{\"name\": \"x\", \"stages\": [{\"kind\": \"inverting\", \"input\": \"R1(1k)\", \"feedback\": \"R2(10k) + R3(4kk7)\"}]}";
        DesignException e = assertThrows(DesignException.class, () -> DesignReader.parse(json, "d.json"));
        assertEquals(1, e.stageNumber().orElseThrow());
        assertEquals("feedback", e.role());
        assertEquals(14, e.column().orElseThrow());
    }

    @Test
    void fileErrorsNameTheFile(@TempDir Path dir) throws Exception {
        DesignException missing = assertThrows(DesignException.class, () -> DesignReader.read(dir.resolve("nope.json")));
        assertEquals("nope.json: no such file", missing.getMessage());
        Path bin = dir.resolve("bin.json");
        Files.write(bin, new byte[] {(byte) 0xff, (byte) 0xfe, 0x00});
        assertEquals("bin.json: not UTF-8 text", assertThrows(DesignException.class, () -> DesignReader.read(bin)).getMessage());
        assertTrue(assertThrows(DesignException.class, () -> DesignReader.read(dir)).getMessage().endsWith("is a folder, not a design file"));
    }
}
