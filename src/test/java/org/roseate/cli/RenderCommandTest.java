package org.roseate.cli;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;
import javax.sound.sampled.AudioFileFormat;
import javax.sound.sampled.AudioFormat;
import javax.sound.sampled.AudioSystem;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;
import org.roseate.io.WavReader;

class RenderCommandTest {
    @TempDir
    Path dir;

    static Stream<Arguments> presetRateBits() {
        String[] presets = {"bench-pink.json", "wide-pink.json", "passive-pink.json", "random-voltage.json"};
        int[] rates = {44100, 48000, 96000, 192000};
        String[] bits = {"16", "24", "32f"};
        List<Arguments> list = new ArrayList<>();
        for (int p = 0; p < presets.length; p++) {
            for (int r = 0; r < rates.length; r++) {
                list.add(Arguments.of(presets[p], rates[r], bits[(p + r) % 3]));
            }
        }
        return list.stream();
    }

    /**
     * Every preset renders at every rate; the bit depths rotate so each appears at each rate. The
     * header is read back by javax.sound.sampled (a reader outside the project) and by WavReader.
     */
    @ParameterizedTest(name = "{0} at {1} Hz, {2} bits")
    @MethodSource("presetRateBits")
    void presetsRenderToValidWav(String preset, int rate, String bits) throws Exception {
        Path out = dir.resolve("out.wav");
        var r = AnalyzeCommandTest.run("render", "presets/" + preset, "-o", out.toString(), "--rate", Integer.toString(rate),
                "--bits", bits, "--seconds", "0.25", "--channels", "2");
        assertEquals(0, r.status(), r.err());
        assertTrue(r.out().contains("Digital model at " + rate + " Hz"), "fidelity figures are printed");
        assertTrue(r.out().contains("dBFS RMS (requested -20.00)"), r.out());
        AudioFileFormat aff = AudioSystem.getAudioFileFormat(out.toFile());
        AudioFormat f = aff.getFormat();
        assertEquals(AudioFileFormat.Type.WAVE, aff.getType());
        assertEquals(rate, f.getSampleRate(), 0);
        assertEquals(2, f.getChannels());
        assertEquals(bits.equals("32f") ? 32 : Integer.parseInt(bits), f.getSampleSizeInBits());
        assertEquals(bits.equals("32f") ? AudioFormat.Encoding.PCM_FLOAT : AudioFormat.Encoding.PCM_SIGNED, f.getEncoding());
        long frames = Math.round(0.25 * rate);
        assertEquals(frames, aff.getFrameLength());
        try (WavReader wr = WavReader.open(out)) {
            assertEquals(frames, wr.frames());
        }
    }

    @Test
    void sameSeedSameBytesOtherwiseDifferent() throws Exception {
        Path a = dir.resolve("a.wav");
        Path b = dir.resolve("b.wav");
        Path c = dir.resolve("c.wav");
        assertEquals(0, AnalyzeCommandTest.run("render", "presets/bench-pink.json", "-o", a.toString(), "--seconds", "0.5", "--seed", "9").status());
        assertEquals(0, AnalyzeCommandTest.run("render", "presets/bench-pink.json", "-o", b.toString(), "--seconds", "0.5", "--seed", "9").status());
        assertEquals(0, AnalyzeCommandTest.run("render", "presets/bench-pink.json", "-o", c.toString(), "--seconds", "0.5", "--seed", "10").status());
        assertArrayEquals(Files.readAllBytes(a), Files.readAllBytes(b));
        assertFalse(java.util.Arrays.equals(Files.readAllBytes(a), Files.readAllBytes(c)));
    }

    @Test
    void existingFileIsReplacedOnlyWithForce() throws Exception {
        Path out = dir.resolve("keep.wav");
        Files.writeString(out, "precious");
        var r = AnalyzeCommandTest.run("render", "--source", "white", "-o", out.toString(), "--seconds", "0.1");
        assertEquals(2, r.status());
        assertEquals("roseate: " + out + " already exists; add --force to replace it", r.err().strip());
        assertEquals("precious", Files.readString(out));
        assertEquals(0, AnalyzeCommandTest.run("render", "--source", "white", "-o", out.toString(), "--seconds", "0.1", "--force").status());
        assertTrue(Files.size(out) > 44);
        try (Stream<Path> left = Files.list(dir)) {
            assertEquals(List.of(out), left.toList(), "no temporary file left beside the output");
        }
    }

    @Test
    void referenceSourcesNeedNoDesign() {
        assertEquals(0, AnalyzeCommandTest.run("render", "--source", "white", "-o", dir.resolve("w.wav").toString(), "--seconds", "0.2").status());
        var r = AnalyzeCommandTest.run("render", "--source", "ideal-pink", "-o", dir.resolve("p.wav").toString(), "--seconds", "0.2", "--rate", "44100");
        assertEquals(0, r.status(), r.err());
        assertTrue(r.out().contains("ideal pink"));
    }

    /** Control-rate mode: CSV (time, value) at 100 Hz with the signal's statistics. */
    @Test
    void controlRateCsvWithStatistics() throws Exception {
        Path out = dir.resolve("cv.csv");
        // the preset without its "source": a relative render at --level, scaled by --volts-per-fs
        Path design = RenderVoltsCommandTest.withoutSource(dir);
        var r = AnalyzeCommandTest.run("render", design.toString(), "--control-rate", "100", "-o", out.toString(),
                "--seconds", "30", "--level", "-12", "--volts-per-fs", "5");
        assertEquals(0, r.status(), r.err());
        List<String> lines = Files.readAllLines(out);
        assertEquals("seconds,volts", lines.get(0));
        assertEquals(1 + 3000, lines.size());
        assertTrue(lines.get(2).startsWith("0.01,"), lines.get(2));
        assertTrue(r.out().contains("Percentiles:") && r.out().contains("50%:") && r.out().contains(" V"), r.out());
        // A control-rate WAV works too.
        assertEquals(0, AnalyzeCommandTest.run("render", design.toString(), "--control-rate", "250", "-o",
                dir.resolve("cv.wav").toString(), "--seconds", "5").status());
    }

    @Test
    void badArgumentsGiveOneLineAndStatusTwo() {
        String w = dir.resolve("x.wav").toString();
        String[][] cases = {
            {"render", "presets/bench-pink.json", "-o", w, "--rate", "22050"},
            {"render", "presets/bench-pink.json", "-o", w, "--bits", "12"},
            {"render", "presets/bench-pink.json", "-o", w, "--channels", "3"},
            {"render", "presets/bench-pink.json", "-o", w, "--level", "3"},
            {"render", "presets/bench-pink.json", "-o", w, "--seconds", "-1"},
            {"render", "presets/bench-pink.json", "-o", dir.resolve("x.csv").toString()},
            {"render", "presets/bench-pink.json", "-o", dir.resolve("x.mp3").toString()},
            {"render", "presets/bench-pink.json", "-o", w, "--control-rate", "50"},
            {"render", "-o", w},
            {"render", "presets/bench-pink.json", "-o", w, "--source", "grey"},
            {"render", "presets/bench-pink.json", "-o", dir.resolve("no/such/folder/x.wav").toString()},
        };
        for (String[] c : cases) {
            var r = AnalyzeCommandTest.run(c);
            assertEquals(2, r.status(), String.join(" ", c) + ": " + r.err());
            assertTrue(r.err().startsWith("roseate: "), r.err());
            assertFalse(r.err().contains("\tat "), "no stack trace: " + r.err());
            assertFalse(Files.exists(Path.of(w)), "nothing written for " + String.join(" ", c));
        }
    }

    /** Issue 15: a duration shorter than one output sample is refused, and nothing is written. */
    @Test
    void durationShorterThanOneSampleIsRefused() {
        Path out = dir.resolve("short.wav");
        var r = AnalyzeCommandTest.run("render", "--source", "white", "-o", out.toString(), "--seconds", "0.00001");
        assertEquals(2, r.status());
        assertTrue(r.err().startsWith("roseate: --seconds: 1.0E-5 s is shorter than one sample at 48000 Hz"), r.err());
        assertEquals("", r.out());
        assertFalse(Files.exists(out));
    }

    /** Issue 15: --rate and --control-rate together are refused, naming both. */
    @Test
    void rateWithControlRateIsRefused() {
        Path out = dir.resolve("cv.csv");
        var r = AnalyzeCommandTest.run("render", "--source", "white", "-o", out.toString(), "--control-rate", "100", "--rate", "48000");
        assertEquals(2, r.status());
        assertTrue(r.err().startsWith("roseate: --rate and --control-rate both given"), r.err());
        assertEquals(1, r.err().strip().lines().count(), "one line");
        assertFalse(Files.exists(out));
    }

    /**
     * Issue 15: at audio rates --volts-per-fs is refused for what has no voltage (white noise, a design
     * without a "source"); issue 13 made it map volts for a design with one (RenderVoltsCommandTest).
     */
    @Test
    void voltsPerFullScaleWithoutControlRateIsRefused() {
        Path out = dir.resolve("a.wav");
        var r = AnalyzeCommandTest.run("render", "--source", "white", "-o", out.toString(), "--volts-per-fs", "5");
        assertEquals(2, r.status());
        assertTrue(r.err().startsWith("roseate: --volts-per-fs at audio rates needs a design with a \"source\""), r.err());
        assertFalse(Files.exists(out));
    }

    /** Issue 15: an existing output is refused before any work: nothing printed, the file untouched. */
    @Test
    void existingOutputIsRefusedBeforeAnyPrinting() throws Exception {
        Path out = dir.resolve("keep.wav");
        Files.writeString(out, "precious");
        var r = AnalyzeCommandTest.run("render", "presets/bench-pink.json", "-o", out.toString(), "--seconds", "60");
        assertEquals(2, r.status());
        assertEquals("", r.out(), "no fidelity table or anything else before the refusal");
        assertEquals("roseate: " + out + " already exists; add --force to replace it", r.err().strip());
        assertEquals("precious", Files.readString(out));
    }

    /**
     * Issue 12: the figures are those of the file written. 16-bit white noise requested at −120 dBFS is
     * below one LSB, so the file holds mostly TPDF dither and rounding: total error variance 1/4 LSB²
     * (Lipshitz, Wannamaker and Vanderkooy, J. Audio Eng. Soc. 40(5), 1992, from memory), i.e.
     * 20·log10(√2 · 0.5/32768) = −93.3 dBFS. The JSON figures are checked against the file as read by
     * javax.sound.sampled (a reader outside the project), to 1e-9 dB (double rounding only).
     */
    @Test
    void jsonFiguresAreThoseOfTheWrittenFile() throws Exception {
        Path out = dir.resolve("quiet.wav");
        var r = AnalyzeCommandTest.run("render", "--source", "white", "-o", out.toString(), "--seconds", "2",
                "--bits", "16", "--level", "-120", "--format", "json");
        assertEquals(0, r.status(), r.err());
        var j = new com.fasterxml.jackson.databind.ObjectMapper().readTree(r.out());
        double sumSq = 0;
        double peak = 0;
        long n = 0;
        try (var in = AudioSystem.getAudioInputStream(out.toFile())) {
            byte[] b = in.readAllBytes();
            for (int i = 0; i + 1 < b.length; i += 2) {
                double v = (short) ((b[i] & 0xff) | (b[i + 1] << 8)) / 32768.0;
                sumSq += v * v;
                peak = Math.max(peak, Math.abs(v));
                n++;
            }
        }
        double levelDbfs = 10 * Math.log10(2 * sumSq / n);
        double peakDbfs = 20 * Math.log10(peak);
        assertEquals(levelDbfs, j.get("levelDbfs").asDouble(), 1e-9);
        assertEquals(peakDbfs, j.get("peakDbfs").asDouble(), 1e-9);
        assertEquals(peakDbfs - (levelDbfs - 10 * Math.log10(2)), j.get("crestFactorDb").asDouble(), 1e-9, "crest factor = peak / RMS");
        assertEquals(0, j.get("clippedSamples").asLong());
        assertEquals(-93.3, levelDbfs, 0.1, "dither and rounding of a sub-LSB signal (the file, not the request)");
        assertEquals(-120, j.get("requestedLevelDbfs").asDouble());
        assertTrue(j.get("fidelity").isArray());
    }

    /** JSON of a design render carries one fidelity entry per third-octave band, 20 Hz to 20 kHz (31 bands, IEC 61260-1). */
    @Test
    void jsonCarriesFidelityPerBand() throws Exception {
        Path out = dir.resolve("p.wav");
        var r = AnalyzeCommandTest.run("render", "presets/bench-pink.json", "-o", out.toString(), "--seconds", "0.5",
                "--format", "json");
        assertEquals(0, r.status(), r.err());
        var j = new com.fasterxml.jackson.databind.ObjectMapper().readTree(r.out());
        assertEquals(31, j.get("fidelity").size());
        for (var b : j.get("fidelity")) {
            assertTrue(b.get("withinTolerance").asBoolean(), b.toString());
        }
        for (String key : new String[] {"levelDbfs", "peakDbfs", "crestFactorDb", "clippedSamples"}) {
            assertTrue(j.get(key).isNumber(), key);
        }
    }
}
