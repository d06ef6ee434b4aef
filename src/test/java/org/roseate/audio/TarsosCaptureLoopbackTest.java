package org.roseate.audio;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Arrays;
import java.util.Map;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.condition.EnabledIfEnvironmentVariable;

/**
 * The live capture path runs on TarsosDSP's {@code AudioDispatcher} over the Java Sound input line,
 * and a stereo signal played into the virtual sound card of {@code .ci/virtual-soundcard.sh} comes
 * back through it sample for sample. The played signal is raw 16-bit PCM written straight to the
 * output line (no render chain), so the reference is exactly the bytes written; the null sink passes
 * 16-bit samples at its own rate and format through unchanged (see {@link VirtualSoundcardLoopbackTest}).
 *
 * <p>Runs only with ROSEATE_VIRTUAL_SOUNDCARD=1.
 */
@EnabledIfEnvironmentVariable(named = "ROSEATE_VIRTUAL_SOUNDCARD", matches = "1")
class TarsosCaptureLoopbackTest {
    static final int RATE_HZ = 48000;
    static final int CHANNELS = 2;
    static final int BUFFER_FRAMES = VirtualSoundcardLoopbackTest.BUFFER_FRAMES;

    @Test
    void stereoSignalComesBackSampleExactThroughTheDispatcher() throws Exception {
        // 100 ms of digital silence first: the server may replace up to ~10 ms at a stream's start by
        // silence (VirtualSoundcardLoopbackTest), which then cannot differ from what was played.
        int leadFrames = RATE_HZ / 10;
        int signalFrames = 2 * RATE_HZ;
        int playedFrames = leadFrames + signalFrames;
        int[] played = new int[playedFrames * CHANNELS];
        SplittableRandom rng = new SplittableRandom(20261202L);
        for (int i = leadFrames; i < playedFrames; i++) {
            // Independent channels, so a swap or a lost half of a frame cannot go unnoticed.
            played[i * CHANNELS] = rng.nextInt(-12000, 12000);
            played[i * CHANNELS + 1] = rng.nextInt(-3000, 3000);
        }
        byte[] bytes = new byte[played.length * 2];
        for (int i = 0; i < played.length; i++) {
            bytes[2 * i] = (byte) played[i];
            bytes[2 * i + 1] = (byte) (played[i] >> 8);
        }

        InputLine in = Devices.openInput(null, RATE_HZ, CHANNELS, BUFFER_FRAMES);
        CaptureEngine capture = new CaptureEngine(in, 4 * RATE_HZ, 2.0);
        double[] captured = new double[(playedFrames + 3 * RATE_HZ) * CHANNELS];
        int[] capturedFrames = {0};
        capture.start();
        CaptureEngine.Delivery delivery = capture.deliverTo((block, frames) -> {
            int n = Math.min(captured.length / CHANNELS - capturedFrames[0], frames);
            System.arraycopy(block, 0, captured, capturedFrames[0] * CHANNELS, n * CHANNELS);
            capturedFrames[0] += n;
        });
        Thread.sleep(300);
        StackTraceElement[] captureStack = captureThreadStack(in.deviceName());

        OutputLine out = Devices.openOutput(null, RATE_HZ, CHANNELS, BUFFER_FRAMES);
        out.start();
        int written = 0;
        while (written < bytes.length) {
            int n = out.write(bytes, written, Math.min(4096, bytes.length - written));
            assertTrue(n > 0, "the output line stopped taking data");
            written += n;
        }
        Thread.sleep(500); // the line's 100 ms buffer plays out, and the monitor catches up
        out.close();
        capture.stop();
        delivery.finish();

        assertTrue(Arrays.stream(captureStack).anyMatch(f -> f.getClassName().equals("be.tarsos.dsp.AudioDispatcher")
                && f.getMethodName().equals("run")), "the capture thread must run TarsosDSP's dispatcher: "
                + Arrays.toString(captureStack));
        assertNull(capture.failure());
        assertEquals(0, capture.droppedFrames());

        int cf = capturedFrames[0];
        int[] c = new int[cf * CHANNELS];
        for (int i = 0; i < c.length; i++) {
            double code = captured[i] * 32768;
            c[i] = (int) code;
            assertEquals(c[i], code, 0.0, "decoded 16-bit samples are exact multiples of 1/32768; sample " + i);
        }
        int lag = VirtualSoundcardLoopbackTest.lagByCrossCorrelation(played, c, CHANNELS);
        assertTrue(lag >= 0 && lag + playedFrames <= cf,
                "played stream (" + playedFrames + " frames) at lag " + lag + " must lie inside the capture (" + cf + " frames)");
        for (int i = 0; i < played.length; i++) {
            assertEquals(played[i], c[lag * CHANNELS + i], "sample " + i + " (frame " + i / CHANNELS + ", channel " + i % CHANNELS + ")");
        }
        for (int i = 0; i < lag * CHANNELS; i++) {
            assertEquals(0, c[i], "capture before playback must be silent; sample " + i);
        }
    }

    /** The stack of the engine's capture thread (named after the device), taken while it runs. */
    private static StackTraceElement[] captureThreadStack(String deviceName) {
        for (Map.Entry<Thread, StackTraceElement[]> e : Thread.getAllStackTraces().entrySet()) {
            if (e.getKey().getName().equals("roseate-capture " + deviceName)) {
                return e.getValue();
            }
        }
        throw new AssertionError("no capture thread for " + deviceName);
    }
}
