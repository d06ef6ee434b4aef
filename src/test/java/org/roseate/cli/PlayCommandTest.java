package org.roseate.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.condition.EnabledIfEnvironmentVariable;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;
import org.junit.jupiter.params.provider.ValueSource;
import org.roseate.audio.AudioDeviceException;

class PlayCommandTest {
    static AnalyzeCommandTest.Run run(String... args) {
        return AnalyzeCommandTest.run(args);
    }

    @ParameterizedTest
    @ValueSource(strings = {"-9.9", "-5", "0"})
    void levelsAboveMinusTenNeedAllowLoud(String level) {
        AnalyzeCommandTest.Run r = run("play", "--source", "white", "--level", level, "--seconds", "1", "--device", "nosuch");
        assertEquals(2, r.status(), r.err());
        assertTrue(r.err().contains("--allow-loud"), r.err());
        // Refused before any device is touched: no caution, no device message.
        assertFalse(r.out().contains("Caution"), r.out());
    }

    @Test
    void allowLoudLetsTheLevelThroughToTheDeviceAndAboveFullScaleIsRefused() {
        // With --allow-loud the level check passes and the (missing) device is what fails: status 3.
        AnalyzeCommandTest.Run loud = run("play", "--source", "white", "--level", "-5", "--allow-loud", "--seconds", "1", "--device", "nosuch");
        assertEquals(3, loud.status(), loud.err());
        AnalyzeCommandTest.Run over = run("play", "--source", "white", "--level", "1", "--allow-loud", "--seconds", "1");
        assertEquals(2, over.status(), over.err());
        assertTrue(over.err().contains("above full scale"), over.err());
    }

    @Test
    void aMissingDeviceIsOneLineWithStatusThreeNamingItAndWhatToTry() {
        AnalyzeCommandTest.Run r = run("play", "--source", "white", "--seconds", "1", "--device", "nosuch-device");
        assertEquals(3, r.status(), r.err());
        assertEquals(1, r.err().strip().split("\n").length, r.err());
        assertTrue(r.err().contains("roseate devices"), r.err());
        assertTrue(r.out().contains("Caution: noise can damage hearing"), r.out());
    }

    @ParameterizedTest
    @EnumSource(AudioDeviceException.Kind.class)
    void everyDeviceFaultNamesTheDeviceAndARemedy(AudioDeviceException.Kind kind) {
        DeviceException e = PlayCommand.deviceError(new AudioDeviceException(kind, "Card X", "audio device 'Card X' trouble"));
        assertTrue(e.getMessage().startsWith("audio device 'Card X' trouble; "), e.getMessage());
        assertTrue(e.getMessage().contains("roseate devices") || e.getMessage().contains("roseate render"), e.getMessage());
        assertFalse(e.getMessage().contains("\n"));
    }

    @Test
    void badArgumentsGiveStatusTwo(@TempDir Path dir) throws Exception {
        Path d = dir.resolve("d.json");
        Files.copy(Path.of("presets/bench-pink.json"), d);
        String[][] cases = {
            {"play"},
            {"play", "--source", "purple"},
            {"play", "--source", "design"},
            {"play", "--source", "white", d.toString()},
            {"play", d.toString(), d.toString()},
            {"play", d.toString(), "--switch-every", "4s"},
            {"play", d.toString(), d.toString(), "--switch-every", "fast"},
            {"play", d.toString(), d.toString(), "--switch-every", "10ms"},
            {"play", d.toString(), "--rate", "1000"},
            {"play", d.toString(), "--buffer-ms", "0"},
            {"play", d.toString(), "--seconds", "-1"},
            {"play", d.toString(), "--save-capture", dir.resolve("c.wav").toString()},
            {"play", dir.resolve("missing.json").toString(), "--seconds", "1"},
        };
        for (String[] c : cases) {
            AnalyzeCommandTest.Run r = run(c);
            assertEquals(2, r.status(), String.join(" ", c) + " → " + r.err());
            assertTrue(r.err().startsWith("roseate: "), r.err());
        }
    }

    @Test
    void durations() {
        assertEquals(4_000_000_000L, PlayCommand.parseDurationNanos("4s"));
        assertEquals(4_000_000_000L, PlayCommand.parseDurationNanos("4"));
        assertEquals(500_000_000L, PlayCommand.parseDurationNanos("500ms"));
        assertEquals(1_500_000_000L, PlayCommand.parseDurationNanos("1.5s"));
    }

    @Test
    @EnabledIfEnvironmentVariable(named = "ROSEATE_VIRTUAL_SOUNDCARD", matches = "1")
    void playsOnTheVirtualCardAndReportsLatencyAndUnderruns() {
        AnalyzeCommandTest.Run r = run("play", "--source", "white", "--seconds", "1.2");
        assertEquals(0, r.status(), r.err());
        assertTrue(r.out().contains("buffer 4800 frames = 100.0 ms output latency"), r.out());
        assertTrue(r.out().contains("Underruns: 0"), r.out());
    }

    @Test
    @EnabledIfEnvironmentVariable(named = "ROSEATE_VIRTUAL_SOUNDCARD", matches = "1")
    void alternatesTwoDesignsAndSaysWhichIsPlaying(@TempDir Path dir) throws Exception {
        Path cap = dir.resolve("cap.wav");
        AnalyzeCommandTest.Run r = run("play", "presets/bench-pink.json", "presets/wide-pink.json", "--switch-every", "500ms",
                "--seconds", "1.3", "--save-capture", cap.toString());
        assertEquals(0, r.status(), r.err());
        assertTrue(r.out().contains("Playing A: bench-pink.json"), r.out());
        assertTrue(r.out().contains("now playing B: wide-pink.json"), r.out());
        assertTrue(r.out().contains("now playing A: bench-pink.json"), r.out());
        assertTrue(r.out().contains("Underruns: 0"), r.out());
        // 1.3 s at 48 kHz, stereo, 16 bit, after the 44-byte plain PCM header (RIFF/WAVE layout).
        assertEquals(44 + 62400L * 4, Files.size(cap));
    }
}
