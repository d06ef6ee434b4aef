package org.roseate.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.roseate.budget.Gaussian;
import org.roseate.budget.Thermal;

class BudgetCommandTest {
    private static final String REF_A = "src/test/resources/reference/budget/reference-a.json";

    @Test
    void jsonHasTheNamedKeysAndConsistentFigures() throws Exception {
        AnalyzeCommandTest.Run r = AnalyzeCommandTest.run("budget", REF_A, "--format", "json", "--freqs", "100,1k", "--bands", "octave");
        assertEquals(0, r.status(), r.err());
        JsonNode j = new ObjectMapper().readTree(r.out());
        for (String key : new String[] {"rangeHz", "outputRmsV", "sourceRmsV", "selfNoiseRmsV", "rateRmsVPerS", "zeroCrossingsPerS",
            "outputDensity", "bands", "stages", "contributors"}) {
            assertTrue(j.has(key), "lacks " + key);
        }
        assertEquals(20, j.get("rangeHz").get(0).asDouble());
        assertEquals(20000, j.get("rangeHz").get(1).asDouble());
        assertEquals(2, j.get("outputDensity").size());
        assertEquals(1000, j.get("outputDensity").get(1).get("hz").asDouble());
        assertTrue(j.get("outputDensity").get(1).has("vPerRtHz"));
        assertEquals(10, j.get("bands").size(), "31.5 Hz to 16 kHz: 10 octave bands (IEC 61260-1)");
        for (String k : new String[] {"nominalHz", "lowHz", "highHz", "dbv"}) {
            assertTrue(j.get("bands").get(0).has(k), k);
        }
        // powers add: output² = source² + self² (uncorrelated parts)
        double out = j.get("outputRmsV").asDouble();
        double src = j.get("sourceRmsV").asDouble();
        double self = j.get("selfNoiseRmsV").asDouble();
        assertEquals(out * out, src * src + self * self, out * out * 1e-12);
        double sum2 = 0;
        for (JsonNode c : j.get("contributors")) {
            sum2 += c.get("rmsV").asDouble() * c.get("rmsV").asDouble();
        }
        assertEquals(out * out, sum2, out * out * 1e-12);
        assertEquals(3, j.get("stages").size());
        for (JsonNode s : j.get("stages")) {
            for (String k : new String[] {"stage", "rmsV", "swingV", "headroomDb", "clipProbability", "slewRmsVPerUs"}) {
                assertTrue(s.has(k), k);
            }
        }
        JsonNode s1 = j.get("stages").get(0);
        assertEquals(13.0, s1.get("swingV").asDouble());
        assertEquals(20 * Math.log10(13.0 / s1.get("rmsV").asDouble()), s1.get("headroomDb").asDouble(), 1e-12);
        assertEquals(Gaussian.exceedanceProbability(13.0, s1.get("rmsV").asDouble()), s1.get("clipProbability").asDouble(), 0);
        assertTrue(j.get("stages").get(1).get("swingV").isNull(), "the divider has no op-amp");
    }

    @Test
    void tableAndCsvForms() {
        AnalyzeCommandTest.Run t = AnalyzeCommandTest.run("budget", REF_A);
        assertEquals(0, t.status(), t.err());
        assertTrue(t.out().contains("Output RMS:"), t.out());
        assertTrue(t.out().contains("Zero crossings:"), t.out());
        AnalyzeCommandTest.Run c = AnalyzeCommandTest.run("budget", REF_A, "--format", "csv", "--freqs", "1000");
        assertEquals(0, c.status(), c.err());
        assertTrue(c.out().startsWith("hz,vPerRtHz\n1000.0,"), c.out());
        AnalyzeCommandTest.Run b = AnalyzeCommandTest.run("budget", REF_A, "--format", "csv", "--range", "100-1000");
        assertEquals(0, b.status(), b.err());
        assertTrue(b.out().startsWith("nominalHz,lowHz,highHz,dbv\n"), b.out());
        assertEquals(1 + 11, b.out().split("\n").length, "100 Hz to 1 kHz: 11 third-octave bands");
    }

    @Test
    void plotIsWritten(@TempDir Path dir) {
        Path png = dir.resolve("budget.png");
        AnalyzeCommandTest.Run r = AnalyzeCommandTest.run("budget", REF_A, "--plot", png.toString());
        assertEquals(0, r.status(), r.err());
        assertTrue(Files.exists(png));
    }

    @Test
    void aLoneResistorReadsItsJohnsonNoise(@TempDir Path dir) throws Exception {
        Path f = dir.resolve("r.json");
        Files.writeString(f, "{\"name\": \"r\", \"temperatureC\": 25, \"stages\": [{\"kind\": \"divider\", "
                + "\"series\": \"R1(1k)\", \"shunt\": \"C1(1p)\"}]}");
        AnalyzeCommandTest.Run r = AnalyzeCommandTest.run("budget", f.toString(), "--format", "json", "--freqs", "100");
        assertEquals(0, r.status(), r.err());
        JsonNode j = new ObjectMapper().readTree(r.out());
        // corner 159 MHz: flat at 100 Hz to 1e-12; Johnson density √(4kTR) (Nyquist 1928)
        assertEquals(Thermal.resistorDensityVPerRtHz(1000, 25), j.get("outputDensity").get(0).get("vPerRtHz").asDouble(), 1e-21);
        assertTrue(j.get("sourceRmsV").isNull());
    }

    @ParameterizedTest
    @CsvSource(delimiter = '|', value = {
        "--range|5k-1k|--range",
        "--bands|tenth|--bands: expected octave or third",
        "--freqs|1k,abc|--freqs",
        "--plot|out.txt|--plot",
    })
    void badOptionsAreRefusedWithOneLine(String option, String value, String expected) {
        AnalyzeCommandTest.Run r = AnalyzeCommandTest.run("budget", REF_A, option, value);
        assertEquals(2, r.status());
        assertTrue(r.err().startsWith("roseate: " + expected), r.err());
        assertEquals("", r.out());
    }

    @ParameterizedTest
    @CsvSource(delimiter = '|', value = {
        "\"source\": {\"flickerCornerHz\": 250},|source: missing key 'densityVPerRtHz'",
        "\"source\": {\"densityVPerRtHz\": -1},|source densityVPerRtHz: must be a finite number > 0",
        "\"source\": {\"densityVPerRtHz\": 1e-4, \"corner\": 5},|source: unknown key 'corner'",
        "\"source\": 5,|source: expected an object",
        "\"temperatureC\": -300,|temperatureC: must be between -273.15 and 1000",
        "\"temperatureC\": \"hot\",|temperatureC: expected a number",
    })
    void badSourceAndTemperatureAreRefused(String top, String expected, @TempDir Path dir) throws Exception {
        Path f = dir.resolve("d.json");
        Files.writeString(f, "{\"name\": \"d\", " + top + " \"stages\": [{\"kind\": \"divider\", \"series\": \"R1(1k)\", \"shunt\": \"C1(1u)\"}]}");
        AnalyzeCommandTest.Run r = AnalyzeCommandTest.run("budget", f.toString());
        assertEquals(2, r.status());
        assertEquals("roseate: d.json: " + expected, r.err().strip().substring(0, ("roseate: d.json: " + expected).length()), r.err());
    }

    @ParameterizedTest
    @CsvSource(delimiter = '|', value = {
        "\"enVPerRtHz\": -1e-9|stage 1 opamp enVPerRtHz: must be a finite number >= 0",
        "\"swingV\": 0|stage 1 opamp swingV: must be a finite number > 0",
        "\"slewVPerUs\": \"fast\"|stage 1 opamp slewVPerUs: expected a number",
        "\"swing\": 12|stage 1 opamp: unknown key 'swing'",
    })
    void badOpampKeysAreRefused(String keys, String expected, @TempDir Path dir) throws Exception {
        Path f = dir.resolve("d.json");
        Files.writeString(f, "{\"name\": \"d\", \"stages\": [{\"kind\": \"inverting\", \"input\": \"R1(1k)\", \"feedback\": \"R2(2k)\", "
                + "\"opamp\": {\"gbwHz\": 1e6, " + keys + "}}]}");
        AnalyzeCommandTest.Run r = AnalyzeCommandTest.run("budget", f.toString());
        assertEquals(2, r.status());
        assertTrue(r.err().startsWith("roseate: d.json: " + expected), r.err());
    }

    @Test
    void aDesignWithNothingNoisyIsRefused(@TempDir Path dir) throws Exception {
        Path f = dir.resolve("c.json");
        Files.writeString(f, "{\"name\": \"c\", \"stages\": [{\"kind\": \"divider\", \"series\": \"C1(1n)\", \"shunt\": \"C2(1n)\"}]}");
        AnalyzeCommandTest.Run r = AnalyzeCommandTest.run("budget", f.toString());
        assertEquals(2, r.status());
        assertTrue(r.err().startsWith("roseate: c.json: nothing makes noise"), r.err());
    }

    /** The range limit is the one analyze, measure and compare use (issue 15: no silent cut at the table's edge). */
    @Test
    void aRangeBeyondTheTabulatedBandsIsRefusedWithTheLimitNamed() {
        AnalyzeCommandTest.Run r = AnalyzeCommandTest.run("budget", "presets/bench-pink.json", "--range", "1-1e9");
        assertEquals(2, r.status(), r.err());
        assertTrue(r.err().startsWith("roseate: --range: 1-1e9 reaches beyond the analysable range, 0.4000 Hz to 100.0 kHz"),
                r.err());
    }
}
