package org.roseate.audio;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.concurrent.TimeUnit;
import java.util.concurrent.locks.LockSupport;
import java.util.function.LongSupplier;
import org.junit.jupiter.api.Test;
import org.roseate.noise.FrameSource;

class PlaybackEngineTest {
    static final int RATE = 48000;

    static void waitFor(LongSupplier value, long atLeast, long timeoutMillis) {
        long end = System.nanoTime() + timeoutMillis * 1_000_000L;
        while (value.getAsLong() < atLeast) {
            if (System.nanoTime() > end) {
                throw new AssertionError("timed out waiting for " + atLeast + ", at " + value.getAsLong());
            }
            LockSupport.parkNanos(1_000_000L);
        }
    }

    static double rmsDb(double[] x, int channels, int fromFrame, int frames) {
        double s = 0;
        for (int i = fromFrame * channels; i < (fromFrame + frames) * channels; i++) {
            s += x[i] * x[i];
        }
        return 10 * Math.log10(s / (frames * channels));
    }

    @Test
    void safetyRampReachesTheSetLevelAfterOneSecondAndNotBeforeAndStopFadesToSilence() throws Exception {
        double amplitude = 0.25;
        FakeOutputLine line = new FakeOutputLine(RATE, 1, 4800, false, Long.MAX_VALUE, 3 * RATE);
        PlaybackEngine e = new PlaybackEngine(line, TestSources.sine(RATE, 1, 1000, amplitude), PlaybackSettings.defaults());
        e.start();
        waitFor(line::recordedFrames, 3 * RATE, 10_000);
        e.stop();
        assertNull(e.failure());
        double[] x = line.recorded();
        // A sine of peak A has RMS A/√2 (closed form); windows of 10 ms hold exactly 10 periods.
        double fullDb = 20 * Math.log10(amplitude / Math.sqrt(2));
        int w = RATE / 100;
        for (int start = 0; start + w <= RATE; start += w) {
            double expected = PlaybackEngine.RAMP_FLOOR_DB * (1 - (start + w / 2.0) / RATE);
            double got = rmsDb(x, 1, start, w) - fullDb;
            if (start >= RATE / 10) {
                // Within one window the dB ramp moves 0.6 dB; the RMS of a linear-in-dB gain over
                // the window sits within 0.1 dB of the gain at its centre (second-order term).
                assertEquals(expected, got, 0.1, "ramp at " + start + " frames");
            }
            assertTrue(got < -0.29, "below the set level before 1 s: window at " + start + " reads " + got + " dB");
        }
        for (int start = RATE; start + w <= 2 * RATE; start += w) {
            // Full level from 1 s: only the TPDF dither (1/4 LSB² total error power, far below
            // −100 dB here) can move the RMS.
            assertEquals(0.0, rmsDb(x, 1, start, w) - fullDb, 0.001, "full level at " + start);
        }
    }

    @Test
    void stopFadesOutWithoutAClick() throws Exception {
        FakeOutputLine line = new FakeOutputLine(RATE, 2, 4800, false, Long.MAX_VALUE, 60 * RATE);
        PlaybackSettings s = new PlaybackSettings(0.0, 0.020, 0.030, 2.0, 7L);
        PlaybackEngine e = new PlaybackEngine(line, TestSources.sine(RATE, 2, 997, 0.5), s);
        e.start();
        waitFor(line::recordedFrames, RATE / 2, 10_000);
        e.stop();
        double[] x = line.recorded();
        int n = x.length / 2;
        assertTrue(n < 60 * RATE, "recording must hold the whole stream to see its end");
        // The last frames are silence (only dither: |code| ≤ 1 LSB = 2^-15).
        for (int i = (n - 100) * 2; i < n * 2; i++) {
            assertTrue(Math.abs(x[i]) <= 1.0 / 32768, "sample " + i + " = " + x[i]);
        }
        // During the 20 ms fade the envelope of a 997 Hz sine of peak 0.5 falls linearly: no step
        // larger than the sine's own largest step, 2π·997/48000·0.5 ≈ 0.065 (closed form), plus 2 LSB.
        double maxStep = 2 * Math.PI * 997 / RATE * 0.5 + 2.0 / 32768;
        for (int i = 2; i < n * 2; i += 2) {
            assertTrue(Math.abs(x[i] - x[i - 2]) <= maxStep, "step at frame " + i / 2);
        }
    }

    @Test
    void crossfadeShowsNoJumpBeyondTheNoiseAndAHardSwitchWould() throws Exception {
        double withFade = maxStepRatio(0.030);
        // Reason for 1.2: with equal-power weights over 1440 samples the envelope adds at most
        // (π/2)/1440 × 0.3 ≈ 3e-4 per sample, well below the noise's own steps (~0.005); the largest
        // step over the crossfade is then a draw from the same distribution as over the surrounding
        // stretch, which is 16 times longer and so normally larger; 1.2 covers an unlucky draw.
        assertTrue(withFade <= 1.2, "max step over the crossfade / max step around it = " + withFade);
        // The same sources switched hard jump by about the 0.4 between their offsets.
        double hard = maxStepRatio(0.0);
        assertTrue(hard > 5, "a hard switch must show as a jump; ratio " + hard);
    }

    /** Max |Δx| over the crossfade (or the switch sample) divided by max |Δx| over 250 ms either side. */
    private static double maxStepRatio(double crossfadeSeconds) throws Exception {
        FakeOutputLine line = new FakeOutputLine(RATE, 2, 4800, false, Long.MAX_VALUE, 120 * RATE);
        PlaybackSettings s = new PlaybackSettings(0.0, 0.0, crossfadeSeconds, 2.0, 3L);
        FrameSource a = TestSources.lowpassNoise(RATE, 2, 11L, 0.999, 0.1, +0.2);
        FrameSource b = TestSources.lowpassNoise(RATE, 2, 12L, 0.999, 0.1, -0.2);
        PlaybackEngine e = new PlaybackEngine(line, a, s);
        e.start();
        waitFor(line::recordedFrames, RATE, 20_000);
        e.switchTo(b);
        waitFor(e::switches, 1, 20_000);
        long sw = e.lastSwitchFrame();
        int fade = (int) Math.round(crossfadeSeconds * RATE);
        int around = RATE / 4;
        waitFor(line::recordedFrames, sw + fade + around + 1, 20_000);
        e.stop();
        double[] x = line.recorded();
        double inside = 0;
        double outside = 0;
        for (long f = sw - around; f < sw + fade + around; f++) {
            for (int c = 0; c < 2; c++) {
                double d = Math.abs(x[(int) (f * 2 + c)] - x[(int) ((f - 1) * 2 + c)]);
                if (f >= sw && f <= sw + fade) {
                    inside = Math.max(inside, d);
                } else {
                    outside = Math.max(outside, d);
                }
            }
        }
        return inside / outside;
    }

    @Test
    void aLineThatStopsTakingDataFailsWithinTheTimeoutInsteadOfHanging() throws Exception {
        FakeOutputLine line = new FakeOutputLine(RATE, 2, 4800, false, RATE / 5, RATE);
        PlaybackEngine e = new PlaybackEngine(line, TestSources.sine(RATE, 2, 440, 0.1),
                PlaybackSettings.defaults().withStallTimeoutSeconds(0.5));
        long t0 = System.nanoTime();
        e.start();
        // The watchdog polls every 50 ms at this timeout; 1.5 s leaves room for a loaded machine.
        assertTrue(e.awaitEnd(2000, TimeUnit.MILLISECONDS), "the engine must end by itself");
        double seconds = (System.nanoTime() - t0) * 1e-9;
        assertTrue(seconds >= 0.5 && seconds < 2.0, "ended after " + seconds + " s");
        AudioDeviceException f = e.failure();
        assertNotNull(f);
        assertEquals(AudioDeviceException.Kind.STALLED, f.kind());
        assertTrue(f.getMessage().contains("'fake'"), f.getMessage());
        assertThrows(AudioDeviceException.class, e::throwIfFailed);
        e.stop(); // returns at once after a failure
    }

    @Test
    void underrunsAreCountedFromProgressAndNotInvented() throws Exception {
        // A device playing in real time with a 100 ms buffer, a source that keeps up: none.
        FakeOutputLine steady = new FakeOutputLine(RATE, 2, 4800, true, Long.MAX_VALUE, RATE);
        PlaybackEngine e = new PlaybackEngine(steady, TestSources.sine(RATE, 2, 440, 0.1), PlaybackSettings.defaults());
        e.start();
        Thread.sleep(600);
        e.stop();
        assertEquals(0, e.underruns());
        assertNull(e.failure());

        // The same with a source that once takes 300 ms for a block (three buffers): the device
        // starves once, and the engine must notice.
        FrameSource slow = new FrameSource() {
            final FrameSource inner = TestSources.sine(RATE, 2, 440, 0.1);
            int calls;

            @Override
            public int channels() {
                return 2;
            }

            @Override
            public double sampleRateHz() {
                return RATE;
            }

            @Override
            public void render(double[] x, int frames) {
                if (++calls == 12) {
                    long end = System.nanoTime() + 300_000_000L;
                    while (System.nanoTime() < end) {
                        Thread.onSpinWait();
                    }
                }
                inner.render(x, frames);
            }
        };
        FakeOutputLine starved = new FakeOutputLine(RATE, 2, 4800, true, Long.MAX_VALUE, RATE);
        PlaybackEngine u = new PlaybackEngine(starved, slow, PlaybackSettings.defaults());
        u.start();
        Thread.sleep(900);
        u.stop();
        assertEquals(1, u.underruns(), "one starvation, counted once");
        assertNull(u.failure());
    }

    @Test
    void aSourceThatDoesNotFitTheLineIsRefused() {
        FakeOutputLine line = new FakeOutputLine(RATE, 2, 4800, false, Long.MAX_VALUE, 16);
        IllegalArgumentException ex = assertThrows(IllegalArgumentException.class,
                () -> new PlaybackEngine(line, TestSources.sine(44100, 2, 440, 0.1), PlaybackSettings.defaults()));
        assertTrue(ex.getMessage().contains("44100"), ex.getMessage());
        PlaybackEngine e = new PlaybackEngine(line, TestSources.sine(RATE, 2, 440, 0.1), PlaybackSettings.defaults());
        assertThrows(IllegalArgumentException.class, () -> e.switchTo(TestSources.sine(RATE, 1, 440, 0.1)));
    }
}
