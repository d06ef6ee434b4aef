package org.roseate.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.roseate.io.WavReader;

/** {@code render} of a design with a {@code source}: volts in the CSV, --volts-per-fs at audio rates, refusals. */
class RenderVoltsCommandTest {
    static final String PRESET = "presets/random-voltage.json";

    @TempDir
    Path dir;

    /** The random-voltage preset with its "source" taken out, written into {@code dir}. */
    static Path withoutSource(Path dir) throws java.io.IOException {
        String text = Files.readString(Path.of(PRESET));
        String stripped = text.replaceAll("\\s*\"source\": \\{[^}]*\\},", "");
        assertFalse(stripped.contains("\"source\""), "the source key was removed");
        Path p = dir.resolve("rv-nosource.json");
        Files.writeString(p, stripped);
        return p;
    }

    /** The CSV holds volts: its RMS, computed here from the file, is the printed record RMS. */
    @Test
    void controlRateCsvHoldsVolts() throws Exception {
        Path out = dir.resolve("cv.csv");
        var r = AnalyzeCommandTest.run("render", PRESET, "--control-rate", "100", "--seconds", "120", "-o", out.toString(),
                "--format", "json");
        assertEquals(0, r.status(), r.err());
        JsonNode j = new ObjectMapper().readTree(r.out());
        assertEquals("volts", j.get("unit").asText());
        List<String> lines = Files.readAllLines(out);
        assertEquals("seconds,volts", lines.get(0));
        assertEquals(1 + 12000, lines.size());
        double sum2 = 0;
        for (String line : lines.subList(1, lines.size())) {
            double v = Double.parseDouble(line.split(",")[1]);
            sum2 += v * v;
        }
        double rms = Math.sqrt(sum2 / 12000);
        // the CSV prints each double in full (Double.toString), so the two agree to rounding of the sums
        assertEquals(j.get("record").get("rmsV").asDouble(), rms, 1e-12 * rms);
        JsonNode e = j.get("expected");
        double sigma = e.get("outputRmsSigmaV").asDouble();
        // one record of 120 s; 5σ keeps a false failure below 1e-6 for this fixed seed's check
        assertEquals(e.get("outputRmsV").asDouble(), rms, 5 * sigma);
        assertTrue(j.get("budget").get("outputRmsV").asDouble() > 0);
        assertEquals(1.0 / 120, j.get("rangeHz").get(0).asDouble(), 1e-12);
    }

    @Test
    void levelIsRefusedAtControlRatesWithTheReason() {
        var r = AnalyzeCommandTest.run("render", PRESET, "--control-rate", "100", "--seconds", "60", "-o",
                dir.resolve("x.csv").toString(), "--level", "-12");
        assertEquals(2, r.status());
        assertTrue(r.err().startsWith("roseate: --level does not apply: random-voltage.json has a \"source\""), r.err());
        assertEquals(1, r.err().strip().lines().count());
        assertFalse(Files.exists(dir.resolve("x.csv")));
    }

    /**
     * At audio rates --volts-per-fs used to be refused ("has no meaning without --control-rate"); it still
     * is for a design with no source (no volts to map), and now maps volts for one with a source: the file's
     * samples × V/FS are the volts, whose RMS is the printed record RMS within the 24-bit step.
     */
    @Test
    void voltsPerFsAtAudioRates() throws Exception {
        Path none = withoutSource(dir);
        var refused = AnalyzeCommandTest.run("render", none.toString(), "-o", dir.resolve("n.wav").toString(), "--seconds", "1",
                "--volts-per-fs", "1");
        assertEquals(2, refused.status());
        assertTrue(refused.err().startsWith("roseate: --volts-per-fs at audio rates needs a design with a \"source\""), refused.err());

        Path out = dir.resolve("v.wav");
        var r = AnalyzeCommandTest.run("render", PRESET, "-o", out.toString(), "--seconds", "2", "--volts-per-fs", "0.5",
                "--format", "json");
        assertEquals(0, r.status(), r.err());
        JsonNode j = new ObjectMapper().readTree(r.out());
        assertEquals(0.5, j.get("voltsPerFs").asDouble(), 0);
        assertEquals(0, j.get("clippedSamples").asLong());
        double[] x = WavReader.readAllChannel(out, 0);
        double sum2 = 0;
        for (double v : x) {
            sum2 += (v * 0.5) * (v * 0.5);
        }
        double rms = Math.sqrt(sum2 / x.length);
        // 24-bit codes with TPDF dither: the error per sample is at most 1.5 LSB = 1.5·0.5 V/2^23
        assertEquals(j.get("record").get("rmsV").asDouble(), rms, 1.5 * 0.5 / (1 << 23));
    }

    /** Volts beyond full scale are refused before any work, naming a --volts-per-fs that fits. */
    @Test
    void voltsBeyondFullScaleAreRefused() {
        Path out = dir.resolve("c.wav");
        var r = AnalyzeCommandTest.run("render", PRESET, "-o", out.toString(), "--seconds", "2", "--volts-per-fs", "0.05");
        assertEquals(2, r.status());
        assertTrue(r.err().startsWith("roseate: --volts-per-fs 0.05: the output's expected RMS is "), r.err());
        assertTrue(r.err().contains("would pass full scale and clip; use --volts-per-fs"), r.err());
        assertFalse(Files.exists(out));
    }

    /** The suggested full scale keeps the expected count of overs below 0.01 (erfc, checked from its definition). */
    @Test
    void suggestedFullScaleKeepsOversRare() {
        double fs = VoltsOutput.suggestedFullScale(1.0, 1_000_000);
        double p = org.hipparchus.special.Erf.erfc(fs / Math.sqrt(2));
        assertEquals(0.01, 1_000_000 * p, 1e-6);
    }
}
