package org.roseate.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import org.roseate.audio.AudioDeviceException;
import org.roseate.audio.CaptureEngine;
import org.roseate.audio.Devices;
import org.roseate.audio.InputLine;
import org.roseate.audio.OutputLine;
import org.roseate.audio.PlaybackEngine;
import org.roseate.audio.PlaybackSettings;
import org.roseate.audio.WavCaptureSink;
import org.roseate.io.AtomicOutput;
import org.roseate.io.OutputExistsException;
import org.roseate.io.SampleEncoding;
import org.roseate.io.WavFormat;
import org.roseate.noise.ChainSettings;
import org.roseate.noise.NoiseChain;

/**
 * {@code measure --live}: records line-in to a WAV file (the {@code --save-capture} target, or a
 * temporary file) with a progress display, playing white test noise out at the same time in
 * transfer mode; the measurement then reads that file like any other. Recording first and analysing
 * after keeps one analysis path for files and live captures.
 */
final class LiveCapture {
    /** Captures are 24-bit so the recording adds no audible quantisation to the measurement. */
    private static final SampleEncoding ENCODING = SampleEncoding.PCM_24;
    private static final double BUFFER_SECONDS = 0.1;

    private LiveCapture() {
    }

    /**
     * What to record, as {@code measure --live} and {@code diagnose --live} take it.
     *
     * @param channel     with {@code transfer} false: the channel to measure, from 1 (null: 1); the
     *                    recording holds that many channels
     * @param saveCapture where to keep the recording, or null for a temporary file
     * @param force       replace an existing {@code saveCapture}
     */
    record Request(String device, String outputDevice, int rateHz, double seconds, double levelDbfs, boolean allowLoud,
            boolean transfer, Integer channel, Path saveCapture, boolean force) {
    }

    /** Deletes a temporary capture after its analysis; a failure is only a note on {@code status}. */
    static void deleteTemporary(Path capture, PrintWriter status) {
        try {
            Files.deleteIfExists(capture);
        } catch (IOException e) {
            status.println("roseate: note: could not delete the temporary capture " + capture);
        }
    }

    /**
     * Records to a WAV file and returns its path; status and progress go to {@code out} (stderr, so
     * stdout carries only the measurement and JSON and CSV stay clean).
     */
    static Path record(Request m, PrintWriter out) {
        if (!(m.seconds() > 0) || m.seconds() > 3600) {
            throw new UserInputException("--seconds: expected a recording length from 0 to 3600 s, found " + m.seconds());
        }
        if (m.rateHz() < 8000 || m.rateHz() > 192000) {
            throw new UserInputException("--rate: expected 8000 to 192000 Hz, found " + m.rateHz());
        }
        if (m.transfer() && (m.levelDbfs() > -10 && !m.allowLoud() || m.levelDbfs() > 0)) {
            throw new UserInputException("--level " + m.levelDbfs() + " dBFS: above -10 dBFS needs --allow-loud (and 0 dBFS is the limit)");
        }
        int channels = m.transfer() ? 2 : Math.max(1, m.channel() == null ? 1 : m.channel());
        long frames = Math.round(m.seconds() * m.rateHz());
        int bufferFrames = (int) Math.round(BUFFER_SECONDS * m.rateHz());
        Path target;
        try {
            target = m.saveCapture() != null ? m.saveCapture() : Files.createTempFile("roseate-capture-", ".wav");
            if (m.saveCapture() == null) {
                Files.delete(target);
            }
        } catch (IOException e) {
            throw new UserInputException("cannot create a temporary file for the capture: " + e.getMessage());
        }
        PlaybackEngine player = null;
        try (AtomicOutput file = AtomicOutput.open(target, m.force() || m.saveCapture() == null)) {
            InputLine in = PlayCommand.open(() -> Devices.openInput(m.device(), m.rateHz(), channels, bufferFrames));
            if (m.transfer()) {
                out.println(PlayCommand.CAUTION);
                OutputLine line = PlayCommand.open(() -> Devices.openOutput(m.outputDevice(), m.rateHz(), 2, bufferFrames));
                NoiseChain noise = NoiseChain.white(new ChainSettings(m.rateHz(), 2, true, 1, m.levelDbfs()));
                player = new PlaybackEngine(line, noise, PlaybackSettings.defaults());
                player.start();
                out.println(Numbers.f("Playing white test noise at %.1f dBFS RMS on %s (same noise on both outputs)",
                        m.levelDbfs(), line.deviceName()));
            }
            WavCaptureSink sink = new WavCaptureSink(file.stream(), new WavFormat(m.rateHz(), channels, ENCODING), frames);
            CaptureEngine engine = new CaptureEngine(in, 2 * m.rateHz(), 2.0);
            out.println(Numbers.f("Recording %.1f s from %s at %d Hz, %d channel%s", m.seconds(), in.deviceName(), m.rateHz(),
                    channels, channels == 1 ? "" : "s"));
            out.flush();
            engine.start();
            CaptureEngine.Delivery delivery = engine.deliverTo(sink);
            Progress progress = new Progress(out, "recording");
            long deadline = System.nanoTime() + (long) ((m.seconds() + 5) * 1e9);
            while (sink.framesReceived() < frames && engine.failure() == null && System.nanoTime() < deadline) {
                progress.update((double) sink.framesReceived() / frames);
                Thread.sleep(50);
            }
            progress.done();
            engine.stop();
            delivery.finish();
            if (player != null) {
                player.stop();
                player.throwIfFailed();
            }
            AudioDeviceException f = engine.failure();
            if (f != null) {
                throw PlayCommand.deviceError(f);
            }
            if (sink.framesReceived() < frames) {
                throw new DeviceException("input device '" + in.deviceName() + "' delivered " + sink.framesReceived()
                        + " of " + frames + " frames in time; check the device and try again, or measure a WAV file");
            }
            sink.finish();
            file.commit();
            if (engine.droppedFrames() > 0) {
                out.println("roseate: note: " + engine.droppedFrames() + " frames were dropped while recording");
            }
            if (m.saveCapture() != null) {
                out.println("Saved the capture to " + m.saveCapture());
            }
            return target;
        } catch (OutputExistsException e) {
            throw new UserInputException(e.getMessage());
        } catch (AudioDeviceException e) {
            throw PlayCommand.deviceError(e);
        } catch (IOException e) {
            throw new UserInputException("cannot write the capture " + target + ": " + e.getMessage());
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new UserInputException("recording interrupted");
        } finally {
            if (player != null) {
                player.stop();
            }
        }
    }
}
