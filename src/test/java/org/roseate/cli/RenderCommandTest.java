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
        var r = AnalyzeCommandTest.run("render", "presets/random-voltage.json", "--control-rate", "100", "-o", out.toString(),
                "--seconds", "30", "--level", "-12", "--volts-per-fs", "5");
        assertEquals(0, r.status(), r.err());
        List<String> lines = Files.readAllLines(out);
        assertEquals("seconds,volts", lines.get(0));
        assertEquals(1 + 3000, lines.size());
        assertTrue(lines.get(2).startsWith("0.01,"), lines.get(2));
        assertTrue(r.out().contains("Percentiles:") && r.out().contains("50%:") && r.out().contains(" V"), r.out());
        // A control-rate WAV works too.
        assertEquals(0, AnalyzeCommandTest.run("render", "presets/random-voltage.json", "--control-rate", "250", "-o",
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
}
