package org.roseate.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.roseate.circuit.Component;
import org.roseate.circuit.Design;
import org.roseate.circuit.DesignReader;
import org.roseate.model.CircuitModel;
import org.roseate.tools.Fitter;
import org.roseate.value.Tolerance;
import picocli.CommandLine;

/** The design tools' options and the command line's loose ends, through the real command line. */
class ToolsCommandLineTest {
    static AnalyzeCommandTest.Run run(String... args) {
        return AnalyzeCommandTest.run(args);
    }

    static List<String> subcommands() {
        return List.copyOf(new CommandLine(new RoseateCommand()).getSubcommands().keySet());
    }

    @Test
    void dashVPrintsTheVersionOnEverySubcommand() {
        // every verb; 'help' takes a command name, not options
        for (String sub : subcommands().stream().filter(x -> !x.equals("help")).toList()) {
            var r = run(sub, "-V");
            assertEquals(0, r.status(), sub + ": " + r.err());
            assertTrue(r.out().startsWith("roseate "), sub + " -V printed '" + r.out() + "'");
        }
    }

    @Test
    void noHelpTextPrintsAFormatterWarning() {
        // picocli writes "[picocli WARN] Could not format …" when a description holds a bare '%'
        for (String sub : subcommands()) {
            var r = run(sub, "--help");
            assertEquals(0, r.status(), sub + ": " + r.err());
            assertFalse((r.out() + r.err()).contains("WARN"), sub + " --help:\n" + r.err() + r.out());
            assertFalse(r.out().contains("%n"), sub + " --help left a raw format string");
        }
    }

    @Test
    void theWindowWithoutADisplayExitsWithItsOwnStatus() throws Exception {
        String java = ProcessHandle.current().info().command().orElse("java");
        ProcessBuilder pb = new ProcessBuilder(java, "-cp", System.getProperty("java.class.path"), "org.roseate.Main");
        pb.environment().remove("DISPLAY");
        pb.environment().remove("WAYLAND_DISPLAY");
        Process p = pb.start();
        String err = new String(p.getErrorStream().readAllBytes(), StandardCharsets.UTF_8);
        assertEquals(RoseateCommand.EXIT_NO_DISPLAY, p.waitFor(), err);
        assertEquals(4, RoseateCommand.EXIT_NO_DISPLAY, "the README documents 4");
        assertTrue(err.startsWith("roseate: no display"), err);
        assertEquals(1, err.strip().lines().count(), err);
    }

    @Test
    void aRangeBeyondTheTabulatedBandsIsRefusedWithTheLimitNamed() {
        for (String cmd : List.of("analyze", "compare", "tolerance")) {
            var r = run(cmd, "presets/bench-pink.json", "--range", "1-1e9");
            assertEquals(2, r.status(), cmd);
            // reference: IEC 61260-1 nominal midbands tabulated by bands.Band, 0.4 Hz to 100 kHz
            assertTrue(r.err().startsWith("roseate: --range: 1-1e9 reaches beyond the analysable range, 0.4000 Hz to 100.0 kHz"), r.err());
        }
        var low = run("analyze", "presets/bench-pink.json", "--range", "0.1-10");
        assertEquals(2, low.status());
        assertTrue(low.err().contains("0.4000 Hz"), low.err());
        assertEquals(0, run("analyze", "presets/random-voltage.json", "--range", "0.4-100k").status(), "the limits themselves are allowed");
    }

    @Test
    void conflictingOrMeaninglessCombinationsAreRefusedSayingWhich(@TempDir Path dir) {
        String[][] cases = {
            {"--from and --branches cannot be used together", "fit", "--from", "presets/bench-pink.json", "--branches", "4"},
            {"--from and --divider cannot be used together", "fit", "--from", "presets/bench-pink.json", "--divider"},
            {"--from and --input-r cannot be used together", "fit", "--from", "presets/bench-pink.json", "--input-r", "10k"},
            {"--divider and --input-r cannot be used together", "fit", "--divider", "--input-r", "10k"},
            {"--load applies to a divider ladder only", "fit", "--load", "1M"},
            {"--free-input applies to --from only", "fit", "--free-input"},
            {"--force without -o", "fit", "--force"},
            {"--hold: no part 'R9'", "fit", "--hold", "R9"},
            {"--gain-db: expected a gain and a frequency", "fit", "--gain-db", "40"},
            {"--tolerance: 'U': an op-amp gain-bandwidth tolerance does not belong here", "fit", "--tolerance", "U=5%"},
            {"--slope and --against-nominal cannot be used together", "tolerance", "presets/bench-pink.json", "--against-nominal", "--slope", "white"},
            {"--force without --plot", "tolerance", "presets/bench-pink.json", "--force"},
            {"--tolerance: unknown key 'Q7'", "tolerance", "presets/bench-pink.json", "--tolerance", "Q7=1%"},
        };
        for (String[] c : cases) {
            String[] args = java.util.Arrays.copyOfRange(c, 1, c.length);
            var r = run(args);
            assertEquals(2, r.status(), String.join(" ", args) + ": " + r.err());
            assertTrue(r.err().startsWith("roseate: " + c[0]), String.join(" ", args) + " said: " + r.err());
            assertEquals("", r.out(), "refused before any work");
        }
    }

    @Test
    void fitFromADesignKeepsHeldPartsItsInputAndItsGainAndWritesTolerances(@TempDir Path dir) throws Exception {
        Path out = dir.resolve("refit.json");
        var r = run("fit", "--from", "presets/bench-pink.json", "--hold", "R2,C1", "--starts", "1", "--threads", "1",
                "--bands", "octave", "--tolerance", "R=1%,C=2%,C3=1%", "-o", out.toString());
        assertEquals(0, r.status(), r.err());
        Design before = DesignReader.read(Path.of("presets/bench-pink.json"));
        Design after = DesignReader.read(out);
        for (String held : List.of("R1", "R2", "C1")) {
            // R1 is the input part, kept by default; the values round-trip exactly through the file
            // text because they are short decimal numbers
            assertEquals(before.component(held).orElseThrow().value(), after.component(held).orElseThrow().value(), held);
        }
        assertTrue(r.out().contains("Held (unchanged): R1 R2 C1"), r.out());
        double gainBefore = 20 * Math.log10(CircuitModel.of(before, "b").response(1000).abs());
        double gainAfter = 20 * Math.log10(CircuitModel.of(after, "a").response(1000).abs());
        // the design's own gain at 1 kHz is held; on standard values within the free slack plus the
        // little the steep penalty beyond it may trade (see FitterTest.checkGainHeld)
        assertEquals(gainBefore, gainAfter, Fitter.STANDARD_GAIN_SLACK_DB + 0.02);
        assertTrue(r.out().contains("gain at 1.000 kHz, dB"), r.out());
        assertTrue(r.out().contains("Snapping to standard values moved the gain by"), r.out());
        assertEquals(Map.of("R", new Tolerance(0.01), "C", new Tolerance(0.02), "C3", new Tolerance(0.01)), after.tolerances());
        assertTrue(after.name().endsWith("(refitted)"), after.name());
        for (Component c : after.components()) {
            if (!List.of("R1", "R2", "C1").contains(c.designator())) {
                var e = c.kind() == org.roseate.value.ComponentKind.RESISTOR ? org.roseate.value.ESeries.E24 : org.roseate.value.ESeries.E12;
                assertTrue(e.contains(c.value()), c + " in " + e + " (the defaults: E24 for R, E12 for C)");
            }
        }
    }

    @Test
    void fitNamesEveryValueClampedIntoTheLimits(@TempDir Path dir) throws Exception {
        Path in = dir.resolve("wide.json");
        Files.writeString(in, "{\"name\": \"wide\", \"stages\": [{\"kind\": \"inverting\", \"input\": \"R1(10k)\","
                + " \"feedback\": \"R2(10M) || C1(10p) || (R3(10k) + C2(10n))\"}]}");
        var r = run("fit", "--from", in.toString(), "--starts", "1", "--threads", "1", "--bands", "octave");
        assertEquals(0, r.status(), r.err());
        assertTrue(r.out().contains("Clamped into the limits before fitting: R2 10M -> 2M2"), r.out());
        assertTrue(r.out().contains("Clamped into the limits before fitting: C1 10p -> 100p"), r.out());
    }

    @Test
    void toleranceTakesTolerancesOnTheCommandLineAndJudgesAgainstTheNominal() throws Exception {
        ObjectMapper m = new ObjectMapper();
        var r = run("tolerance", "presets/bench-pink.json", "--trials", "100", "--format", "json",
                "--tolerance", "C=10%,U=20%", "--against-nominal");
        assertEquals(0, r.status(), r.err());
        JsonNode j = m.readTree(r.out());
        assertTrue(j.get("againstNominal").asBoolean());
        assertEquals(0, j.get("nominalMaxBandDeviationDb").asDouble(), 1e-12, "the nominal design judged against itself");
        assertEquals(0.0005, j.get("quantileErrorDb").asDouble());
        double lastContribution = Double.POSITIVE_INFINITY;
        boolean sawOpAmp = false;
        for (JsonNode s : j.get("sensitivities")) {
            String d = s.get("designator").asText();
            if (d.startsWith("C")) {
                assertEquals("10%", s.get("tolerance").asText(), d + ": the command line's C=10% over the file's 5%");
            }
            if (d.equals("U1")) {
                sawOpAmp = true;
                assertEquals("20%", s.get("tolerance").asText());
            }
            double c = s.get("contributionDb").asDouble();
            assertTrue(c <= lastContribution, "ranked by contribution");
            lastContribution = c;
            String tol = s.get("tolerance").isNull() ? null : s.get("tolerance").asText();
            double percent = tol == null ? 0 : Double.parseDouble(tol.replace("%", ""));
            assertEquals(s.get("maxShapeDbPerPercent").asDouble() * percent, c, 1e-12, d);
        }
        assertTrue(sawOpAmp);
        assertEquals(0, j.get("exact").size(), "nothing held exact");
    }

    @Test
    void partsInThreeFormatsWithQuantitiesAndOpAmps(@TempDir Path dir) throws Exception {
        Path in = dir.resolve("twins.json");
        Files.writeString(in, "{\"name\": \"twins\", \"tolerance\": {\"R\": \"1%\", \"R3\": \"0.1%\"}, \"stages\": ["
                + "{\"kind\": \"inverting\", \"input\": \"R1(10k)\", \"feedback\": \"R2(10k) || C1(1n)\","
                + " \"opamp\": {\"gbwHz\": 1e6}},"
                + "{\"kind\": \"inverting\", \"input\": \"R3(10k)\", \"feedback\": \"R4(10k) || C2(1n)\"}]}");
        var j = run("parts", in.toString(), "--format", "json");
        assertEquals(0, j.status(), j.err());
        JsonNode root = new ObjectMapper().readTree(j.out());
        JsonNode first = root.get("parts").get(0);
        assertEquals(3, first.get("quantity").asInt(), "R1 R2 R4: equal value and tolerance; R3 differs by tolerance");
        assertEquals("[\"R1\",\"R2\",\"R4\"]", first.get("designators").toString());
        assertEquals("1%", first.get("tolerance").asText());
        assertTrue(first.get("series").toString().contains("E24"));
        assertEquals(2, root.get("parts").get(1).get("quantity").asInt(), "C1 C2");
        assertEquals("0.1%", root.get("parts").get(2).get("tolerance").asText());
        assertEquals(1, root.get("opamps").size(), "stage 2's op-amp is ideal: no model to buy by");
        assertEquals("U1", root.get("opamps").get(0).get("name").asText());
        assertEquals(1e6, root.get("opamps").get(0).get("gbwHz").asDouble());
        assertEquals(1e5, root.get("opamps").get(0).get("openLoopGain").asDouble(), "the documented default");
        var csv = run("parts", in.toString(), "--format", "csv");
        assertEquals(0, csv.status());
        List<String> lines = csv.out().lines().toList();
        assertEquals("quantity,designators,kind,value,letterCode,series,tolerance,gbwHz,openLoopGain", lines.get(0));
        assertTrue(lines.get(1).startsWith("3,R1 R2 R4,resistor,10000.0,10k,"), lines.get(1));
        assertEquals("1,U1,opamp,,,,,1000000.0,100000.0", lines.get(lines.size() - 1));
        var table = run("parts", in.toString());
        assertTrue(table.out().contains("C0G/NP0") && table.out().contains("metal film"), table.out());
        assertEquals(2, run("parts", in.toString(), "--format", "xml").status());
    }
}
