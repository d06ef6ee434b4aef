package org.roseate.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;
import org.roseate.circuit.DesignReader;
import org.roseate.model.BandPower;
import org.roseate.model.CircuitModel;

class AnalyzeCommandTest {
    record Run(int status, String out, String err) {
    }

    static Run run(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int status = RoseateCommand.run(new PrintWriter(out), new PrintWriter(err), args);
        return new Run(status, out.toString(), err.toString());
    }

    static Stream<Path> presets() throws Exception {
        return Files.list(Path.of("presets")).filter(p -> p.toString().endsWith(".json")).sorted();
    }

    @ParameterizedTest
    @MethodSource("presets")
    void jsonForEveryPresetHasTheDocumentedKeysAndAgreesWithTheModel(Path preset) throws Exception {
        Run r = run("analyze", preset.toString(), "--format", "json", "--freqs", "100,1000,10000");
        assertEquals(0, r.status(), r.err());
        JsonNode j = new ObjectMapper().readTree(r.out());
        for (String key : new String[] {"response", "bands", "slopeDbPerOctave", "maxDeviationDb", "maxBandDeviationDb", "poles", "zeros"}) {
            assertTrue(j.has(key), preset + " lacks " + key);
        }
        assertEquals(3, j.get("response").size());
        assertEquals(31, j.get("bands").size(), "20 Hz–20 kHz has 31 third-octave bands (IEC 61260-1)");
        // The printed numbers are the model's own: re-evaluate independently of the command.
        CircuitModel m = CircuitModel.of(DesignReader.read(preset), "p");
        JsonNode p = j.get("response").get(1);
        assertEquals(1000, p.get("hz").asDouble());
        assertEquals(20 * Math.log10(m.response(1000).abs()), p.get("db").asDouble(), 1e-12);
        JsonNode b = j.get("bands").get(17);
        assertEquals(1000, b.get("nominalHz").asDouble());
        assertEquals(BandPower.levelDb(m::magnitudeSquared, b.get("lowHz").asDouble(), b.get("highHz").asDouble()),
                b.get("db").asDouble(), 1e-12);
        // Centring: the largest and smallest band deviations are equal and opposite.
        double max = Double.NEGATIVE_INFINITY;
        double min = Double.POSITIVE_INFINITY;
        for (JsonNode band : j.get("bands")) {
            max = Math.max(max, band.get("deviationDb").asDouble());
            min = Math.min(min, band.get("deviationDb").asDouble());
        }
        assertEquals(-min, max, 1e-9);
        assertEquals(max, j.get("maxBandDeviationDb").asDouble(), 1e-9);
    }

    @ParameterizedTest
    @MethodSource("presets")
    void tableAndCsvForEveryPreset(Path preset) {
        Run t = run("analyze", preset.toString());
        assertEquals(0, t.status(), t.err());
        assertTrue(t.out().contains("Peak band deviation"));
        assertTrue(t.out().contains("An ideal pink filter reads flat"));
        Run c = run("analyze", preset.toString(), "--format", "csv", "--bands", "octave");
        assertEquals(0, c.status(), c.err());
        assertTrue(c.out().startsWith("nominalHz,lowHz,highHz,db,deviationDb\n"));
        assertEquals(1 + 10, c.out().split("\n").length, "10 octave bands 31.5 Hz–16 kHz");
    }

    @Test
    void badDesignGivesOneLineAndStatusTwo(@TempDir Path dir) throws Exception {
        Path f = dir.resolve("design.json");
        Files.writeString(f, "{\"name\": \"x\", \"stages\": [{\"kind\": \"inverting\", \"input\": \"R1(10k)\", "
                + "\"feedback\": \"R2(10k) + R3(4kk7)\"}]}");
        Run r = run("analyze", f.toString());
        assertEquals(2, r.status());
        assertEquals("roseate: design.json: stage 1 feedback, column 14: expected a value such as 4k7 or 22n, found '4kk7'\n",
                r.err().replace(System.lineSeparator(), "\n"));
        assertFalse(r.err().contains("at org."), "no stack trace");
    }

    @Test
    void badArgumentsGiveStatusTwo() {
        assertEquals(2, run("analyze", "presets/bench-pink.json", "--range", "20000-20").status());
        assertEquals(2, run("analyze", "presets/bench-pink.json", "--bands", "sixth").status());
        assertEquals(2, run("analyze", "presets/bench-pink.json", "--slope", "steep").status());
        assertEquals(2, run("analyze", "presets/bench-pink.json", "--freqs", "1k,abc").status());
        assertEquals(2, run("analyze").status());
        assertEquals(2, run("analyze", "missing.json").status());
        assertEquals(2, run("frobnicate").status());
    }

    /**
     * {@code --rate} adds the digital model's fidelity; one band is recomputed here from the
     * digital path and the analog model with the compare package's own integration.
     */
    @Test
    void rateShowsFidelityFigures() throws Exception {
        Run t = run("analyze", "presets/bench-pink.json", "--rate", "48000");
        assertEquals(0, t.status(), t.err());
        // 8x since the whole 20 kHz band (to 22.39 kHz) is judged at 48 kHz (issue 12, item 7)
        assertTrue(t.out().contains("Digital model at 48000 Hz: 8x oversampled"), t.out());
        Run j = run("analyze", "presets/bench-pink.json", "--rate", "44100", "--format", "json");
        assertEquals(0, j.status(), j.err());
        JsonNode f = new ObjectMapper().readTree(j.out()).get("fidelity");
        assertEquals(31, f.get("bands").size());
        assertTrue(f.get("maxAbsDifferenceDb").asDouble() <= 0.1);
        CircuitModel m = CircuitModel.of(DesignReader.read(Path.of("presets/bench-pink.json")), "p");
        var path = org.roseate.digital.OversampledFilter.design(m.zpk(), 44100, f.get("oversampling").asInt(),
                org.roseate.digital.PrewarpRule.PER_ROOT, 1000);
        JsonNode band = f.get("bands").get(28);
        double lo = band.get("lowHz").asDouble();
        double hi = band.get("highHz").asDouble();
        double expected = BandPower.levelDb(path::magnitudeSquared, lo, hi) - BandPower.levelDb(m::magnitudeSquared, lo, hi);
        // Two different quadratures of the same integrands; the decimator's ±0.005 dB pass-band ripple
        // (period about 1 kHz at 12.5 kHz) limits their agreement to a few 1e-4 dB.
        assertEquals(expected, band.get("differenceDb").asDouble(), 3e-4);
        assertEquals(2, run("analyze", "presets/bench-pink.json", "--rate", "10").status());
    }
}
