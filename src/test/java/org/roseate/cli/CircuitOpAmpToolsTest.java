package org.roseate.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** {@code parts} and {@code tolerance} on designs with a {@code circuit} stage, through the command line. */
class CircuitOpAmpToolsTest {
    private static List<String> names(JsonNode opamps) {
        List<String> out = new ArrayList<>();
        opamps.forEach(o -> out.add(o.get("name").asText() + "@" + o.get("stage").asInt() + ":" + o.get("gbwHz").asDouble()));
        return out;
    }

    @Test
    void partsListsACircuitStagesOpAmpByItsDesignator() throws Exception {
        AnalyzeCommandTest.Run r = AnalyzeCommandTest.run("parts", "presets/random-voltage.json", "--format", "json");
        assertEquals(0, r.status(), r.err());
        // the preset: stage 1 an inverting stage (gbwHz 3e6, no designator in the file), stage 2 a
        // circuit stage whose op-amp the file names U2 (gbwHz 3e6)
        assertEquals(List.of("U1@1:3000000.0", "U2@2:3000000.0"), names(new ObjectMapper().readTree(r.out()).get("opamps")));
        AnalyzeCommandTest.Run t = AnalyzeCommandTest.run("parts", "presets/random-voltage.json");
        assertTrue(t.out().contains("U2     stage 2: gbwHz 3000000.0"), t.out());
    }

    @Test
    void anOlderKindOpAmpGivesWayToACircuitDesignator(@TempDir Path dir) throws Exception {
        // a circuit stage first whose op-amp is called U2, then an inverting stage (stage 2): the
        // inverting stage's op-amp cannot be "U2" too, so it takes the next free number, U3
        Path f = dir.resolve("clash.json");
        Files.writeString(f, "{\"name\": \"clash\", \"stages\": ["
                + "{\"kind\": \"circuit\", \"input\": \"in\", \"output\": \"out\", \"branches\": {\"in m\": \"R1(10k)\", \"m out\": \"R2(10k)\"},"
                + " \"opamps\": {\"U2\": {\"plus\": \"gnd\", \"minus\": \"m\", \"output\": \"out\", \"gbwHz\": 1e6}}},"
                + "{\"kind\": \"inverting\", \"input\": \"R3(10k)\", \"feedback\": \"R4(10k) || C1(1n)\", \"opamp\": {\"gbwHz\": 2e6}}]}");
        AnalyzeCommandTest.Run r = AnalyzeCommandTest.run("parts", f.toString(), "--format", "json");
        assertEquals(0, r.status(), r.err());
        assertEquals(List.of("U2@1:1000000.0", "U3@2:2000000.0"), names(new ObjectMapper().readTree(r.out()).get("opamps")));
    }

    @Test
    void gbwSpreadOfACircuitStagesOpAmpIsRefusedNotIgnored(@TempDir Path dir) throws Exception {
        AnalyzeCommandTest.Run r = AnalyzeCommandTest.run("tolerance", "presets/random-voltage.json", "--tolerance", "U=30%",
                "--trials", "50", "--range", "0.5-50", "--bands", "octave");
        assertEquals(2, r.status(), r.out());
        assertTrue(r.err().startsWith("roseate: the U tolerance (op-amp gbwHz) cannot spread the op-amps of a circuit stage (U2 in stage 2)"),
                r.err());
        assertEquals(1, r.err().strip().lines().count(), r.err());
        // the same from the design file's own tolerance map
        Path f = dir.resolve("rv.json");
        Files.writeString(f, Files.readString(Path.of("presets/random-voltage.json"))
                .replace("\"tolerance\": { \"R\": \"1%\", \"C\": \"10%\" }", "\"tolerance\": { \"R\": \"1%\", \"C\": \"10%\", \"U\": \"30%\" }"));
        AnalyzeCommandTest.Run g = AnalyzeCommandTest.run("tolerance", f.toString(), "--trials", "50", "--range", "0.5-50", "--bands", "octave");
        assertEquals(2, g.status(), g.out() + g.err());
        // without U the run goes ahead (the spread of R and C reaches the circuit stage's parts)
        AnalyzeCommandTest.Run ok = AnalyzeCommandTest.run("tolerance", "presets/random-voltage.json", "--trials", "50",
                "--range", "0.5-50", "--bands", "octave", "--format", "json");
        assertEquals(0, ok.status(), ok.err());
    }
}
