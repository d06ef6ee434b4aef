package org.roseate.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.condition.EnabledIfEnvironmentVariable;
import org.junit.jupiter.api.io.TempDir;
import org.roseate.circuit.DesignReader;
import org.roseate.model.CircuitModel;
import org.roseate.noise.ChainSettings;
import org.roseate.noise.NoiseChain;

/**
 * End to end through the virtual sound card (.ci/virtual-soundcard.sh): a design is played out and
 * captured back from the sink's monitor, and the capture is measured. Runs when
 * ROSEATE_VIRTUAL_SOUNDCARD=1, as .ci/run sets it.
 */
@EnabledIfEnvironmentVariable(named = "ROSEATE_VIRTUAL_SOUNDCARD", matches = "1")
class LiveMeasureTest {
    @TempDir
    Path dir;

    /**
     * The captured third-octave levels follow the model's band shape. Tolerance per band: four times
     * the band's stated uncertainty ε = 1/√(B·T_eff) (bandwidth-time product), plus the digital
     * model's known difference from the analog one in that band, plus 0.02 dB for the mean removed
     * over the bands (itself an average of 31 noisy levels).
     */
    @Test
    void playedDesignCapturedBackFollowsTheModel() throws Exception {
        Path cap = dir.resolve("cap.wav");
        var play = AnalyzeCommandTest.run("play", "presets/bench-pink.json", "--seconds", "14", "--level", "-20",
                "--save-capture", cap.toString());
        assertEquals(0, play.status(), play.err());
        assertTrue(play.out().contains("Underruns: 0"), play.out());
        var m = AnalyzeCommandTest.run("measure", cap.toString(), "--against", "presets/bench-pink.json", "--format", "json");
        assertEquals(0, m.status(), m.err());
        JsonNode j = new ObjectMapper().readTree(m.out());
        CircuitModel model = CircuitModel.of(DesignReader.read(Path.of("presets/bench-pink.json")), "p");
        var fid = NoiseChain.design(model.zpk(), new ChainSettings(48000, 1, false, 1, -20)).fidelity().orElseThrow();
        JsonNode bands = j.get("bands");
        assertEquals(31, bands.size());
        // The 20 kHz band reaches past the 20 kHz audio edge, where the chain's anti-alias filter rolls
        // off by design (NoiseChainTest covers it with the decimator's response); compare the 30 below it.
        for (int i = 0; i < bands.size() - 1; i++) {
            JsonNode b = bands.get(i);
            double diff = b.get("designDifferenceDb").asDouble();
            double tol = 4 * b.get("uncertaintyDb").asDouble() + Math.abs(fid.bands().get(i).differenceDb()) + 0.02;
            assertTrue(Math.abs(diff) <= tol, "band " + b.get("nominalHz") + ": " + diff + " dB, tolerance " + tol);
        }
        // The measured density slope is close to the design's own least-squares slope (analyze: −3.02).
        assertEquals(-3.02, j.get("slopeDbPerOctave").asDouble(), 0.1);
    }

    /** measure --live --transfer plays its own white noise and reads a straight (virtual) cable: H = 1. */
    @Test
    void liveTransferOfAStraightCable() throws Exception {
        Path cap = dir.resolve("live.wav");
        var m = AnalyzeCommandTest.run("measure", "--live", "--transfer", "--reference-channel", "1", "--seconds", "6",
                "--range", "50-16000", "--save-capture", cap.toString(), "--format", "json", "--freqs", "100,1000,10000");
        assertEquals(0, m.status(), m.err());
        assertTrue(Files.size(cap) > 44);
        JsonNode j = new ObjectMapper().readTree(m.out().substring(m.out().indexOf('{')));
        for (JsonNode p : j.get("response")) {
            // The monitor returns both channels bit for bit alike: |H| = 0 dB, coherence 1.
            assertEquals(0, p.get("db").asDouble(), 0.01, p.toString());
            assertTrue(p.get("coherence").asDouble() > 0.999, p.toString());
        }
    }
}
