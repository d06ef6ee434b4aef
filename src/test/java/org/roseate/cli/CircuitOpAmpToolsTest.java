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

    /**
     * The U spread reaches a circuit stage's op-amp: a non-inverting gain of ten built as a
     * {@code circuit} stage (nodal analysis) and as a {@code noninverting} stage (the closed form
     * G/(1 + G/A(s)) with the single-pole A(s) = A0/(1 + s·A0/(2π·GBW)), textbook feedback algebra)
     * give the same percentiles, trial for trial, with gbwHz 100 kHz spread by 30 %. The two models
     * agree to rounding (≈ 1e-12 dB), far below the 0.001 dB bins, so the percentiles are equal to
     * 1e-9 dB unless a value lands on a bin edge, which the equal results show it does not.
     */
    @Test
    void gbwSpreadReachesACircuitStagesOpAmpAsItDoesAnOlderStages(@TempDir Path dir) throws Exception {
        Path circuit = dir.resolve("circuit.json");
        Files.writeString(circuit, "{\"name\": \"c\", \"stages\": [{\"kind\": \"circuit\", \"input\": \"in\", \"output\": \"out\","
                + " \"branches\": {\"m out\": \"R2(90k)\", \"m gnd\": \"R1(10k)\"},"
                + " \"opamps\": {\"U1\": {\"plus\": \"in\", \"minus\": \"m\", \"output\": \"out\", \"gbwHz\": 1e5}}}]}");
        Path older = dir.resolve("older.json");
        Files.writeString(older, "{\"name\": \"o\", \"stages\": [{\"kind\": \"noninverting\", \"ground\": \"R1(10k)\","
                + " \"feedback\": \"R2(90k)\", \"opamp\": {\"gbwHz\": 1e5}}]}");
        JsonNode[] runs = new JsonNode[2];
        Path[] files = {circuit, older};
        for (int i = 0; i < 2; i++) {
            AnalyzeCommandTest.Run r = AnalyzeCommandTest.run("tolerance", files[i].toString(), "--tolerance", "U=30%", "--trials", "2000",
                    "--bands", "octave", "--against-nominal", "--format", "json");
            assertEquals(0, r.status(), r.err());
            runs[i] = new ObjectMapper().readTree(r.out());
        }
        JsonNode top = runs[0].get("bands").get(runs[0].get("bands").size() - 1);
        // the spread is really there: 30 % of a 10 kHz closed-loop corner moves the 16 kHz band by decibels
        assertTrue(top.get("db").get("p95").asDouble() - top.get("db").get("p5").asDouble() > 1, top.toString());
        for (int b = 0; b < runs[0].get("bands").size(); b++) {
            for (String q : List.of("p5", "p50", "p95")) {
                assertEquals(runs[1].get("bands").get(b).get("db").get(q).asDouble(), runs[0].get("bands").get(b).get("db").get(q).asDouble(),
                        1e-9, "band " + b + " " + q);
            }
        }
        assertEquals("U1", runs[0].get("sensitivities").get(0).get("designator").asText());
    }

    @Test
    void theRandomVoltagePresetSpreadsBothOpAmps() throws Exception {
        AnalyzeCommandTest.Run r = AnalyzeCommandTest.run("tolerance", "presets/random-voltage.json", "--tolerance", "U=30%",
                "--trials", "200", "--range", "0.5-50", "--bands", "octave", "--format", "json");
        assertEquals(0, r.status(), r.err());
        List<String> spread = new ArrayList<>();
        new ObjectMapper().readTree(r.out()).get("sensitivities").forEach(p -> {
            if (p.get("designator").asText().startsWith("U")) {
                assertEquals("30%", p.get("tolerance").asText(), p.toString());
                spread.add(p.get("designator").asText());
            }
        });
        assertEquals(List.of("U1", "U2"), spread.stream().sorted().toList());
    }
}
