package org.roseate.app;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.roseate.circuit.DesignReader;
import org.roseate.cli.RoseateCommand;
import org.roseate.measure.BandReader;
import org.roseate.measure.MeasureException;
import org.roseate.measure.MeasureMode;
import org.roseate.measure.MeasureResult;
import org.roseate.model.CircuitModel;
import org.roseate.noise.ChainSettings;
import org.roseate.noise.NoiseChain;
import org.roseate.spectrum.Calibration;
import org.roseate.spectrum.WelchSettings;

/**
 * The window's measurement path (its setup, {@link FileMeasurement} and its CSV export, no display
 * needed) against the command line on the same file and settings: the same bytes, the same refusals.
 */
class MeasureFacesTest {
    @TempDir
    Path dir;

    private static String[] cli(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int status = RoseateCommand.run(new PrintWriter(out), new PrintWriter(err), args);
        return new String[] {Integer.toString(status), out.toString(), err.toString()};
    }

    private static MeasureResult window(Path wav, MeasureSetup s) {
        return FileMeasurement.run(wav, s, p -> { }, () -> false, r -> { });
    }

    @Test
    void cliAndWindowWriteByteIdenticalCsv() throws Exception {
        CircuitModel model = CircuitModel.of(DesignReader.read(Path.of("presets/bench-pink.json")), "bench-pink.json");
        Path wav = dir.resolve("bench.wav");
        RoseateWindowTest.writeNoise(wav, NoiseChain.design(model.zpk(), new ChainSettings(48000, 2, false, 21L, -20)),
                48000, 2, 8);
        AnalysisSettings s = AnalysisSettings.DEFAULT; // 20 Hz–20 kHz, third-octave, pink: the CLI's defaults
        for (BandReader reader : BandReader.values()) {
            MeasureSetup setup = new MeasureSetup(MeasureMode.NOISE_SOURCE, WelchSettings.Averaging.LINEAR, s, 1, 0, model,
                    null, reader);
            String windowCsv = MeasureView.csv(window(wav, setup));
            String[] c = reader == BandReader.FILTER_BANK
                    ? cli("measure", wav.toString(), "--channel", "2", "--against", "presets/bench-pink.json", "--format", "csv", "--bank")
                    : cli("measure", wav.toString(), "--channel", "2", "--against", "presets/bench-pink.json", "--format", "csv");
            assertEquals("0", c[0], c[2]);
            assertArrayEquals(c[1].getBytes(StandardCharsets.UTF_8), windowCsv.getBytes(StandardCharsets.UTF_8), reader.key());
        }
        // transfer mode: the window compares with its target, so the command line is given the same one
        MeasureSetup t = new MeasureSetup(MeasureMode.TRANSFER, WelchSettings.Averaging.LINEAR, s, 1, 0, null, null,
                BandReader.WELCH);
        String[] c = cli("measure", wav.toString(), "--transfer", "--slope", "pink", "--format", "csv");
        assertEquals("0", c[0], c[2]);
        assertArrayEquals(c[1].getBytes(StandardCharsets.UTF_8), MeasureView.csv(window(wav, t)).getBytes(StandardCharsets.UTF_8));
    }

    @Test
    void aCalibrationAtAnotherRateIsRefusedWithTheSameMessageInBothFaces() throws Exception {
        Path loop = dir.resolve("loop.wav");
        RoseateWindowTest.writeNoise(loop, NoiseChain.white(new ChainSettings(44100, 2, true, 3L, -20)), 44100, 2, 4);
        Path cal = dir.resolve("cal.json");
        String[] saved = cli("measure", loop.toString(), "--transfer", "--range", "100-10000", "--save-calibration", cal.toString());
        assertEquals("0", saved[0], saved[2]);
        Path wav = dir.resolve("n48.wav");
        RoseateWindowTest.writeNoise(wav, NoiseChain.white(new ChainSettings(48000, 1, false, 4L, -20)), 48000, 1, 4);
        String[] c = cli("measure", wav.toString(), "--calibration", cal.toString());
        assertEquals("2", c[0]);
        String expected = cal + ": calibration was made at 44100 Hz, the capture is 48000 Hz";
        assertEquals("roseate: " + expected + "\n", c[2]);
        MeasureSetup setup = new MeasureSetup(MeasureMode.NOISE_SOURCE, WelchSettings.Averaging.LINEAR,
                AnalysisSettings.DEFAULT, 0, 0, null, Calibration.read(cal), BandReader.WELCH);
        MeasureException e = assertThrows(MeasureException.class, () -> window(wav, setup));
        assertEquals(expected, e.getMessage());
    }
}
