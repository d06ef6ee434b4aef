package org.roseate.audio;

import java.util.Objects;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicReference;
import java.util.concurrent.locks.LockSupport;
import org.roseate.noise.FrameSource;

/**
 * Plays a {@link FrameSource} through an {@link OutputLine} on a dedicated render thread.
 *
 * <p><b>The render thread</b> works in blocks of a quarter of the line's buffer (16 to 8192
 * frames): it takes a pending source if one is waiting, renders, applies the envelope, converts to
 * PCM with TPDF dither ({@link PcmCodec}) and writes. Its buffers are allocated before it starts; in
 * the loop it allocates nothing, takes no lock of ours, logs nothing and touches no file. (Java
 * Sound's own {@code write} and {@code getLongFramePosition} lock internally; that cannot be
 * avoided and is short.)
 *
 * <p><b>Why not TarsosDSP's AudioPlayer.</b> TarsosDSP 2.4's {@code be.tarsos.dsp.io.jvm.AudioPlayer}
 * opens only the system default line ({@code AudioSystem.getLine}), so no device can be chosen; it is
 * fed through {@code AudioEvent} float buffers converted by TarsosDSP without dither; it prints the
 * buffer size to {@code System.out} from its constructor; and it keeps the {@code SourceDataLine}
 * private, so the frame position (for underruns and stalls) cannot be read and the line cannot be
 * closed from a watchdog. The engine therefore writes to a {@code javax.sound.sampled}
 * {@code SourceDataLine} directly (see {@link Devices}).
 *
 * <p><b>Envelope.</b> At start the gain rises linearly in dB from {@link #RAMP_FLOOR_DB} to 0 dB over
 * the safety ramp, multiplied during the first fade by a linear rise from exact silence; it reaches
 * 1 at the end of the ramp and not before. {@link #stop()} fades linearly to silence. Levels are the
 * source's business (a noise chain renders at its set RMS level); the engine only multiplies by this
 * envelope, which is 1 in steady state.
 *
 * <p><b>Switching.</b> {@link #switchTo} publishes an immutable replacement through an
 * {@link AtomicReference}; the render thread takes it at the next block boundary and crossfades with
 * cos/sin weights, which keeps the power constant for uncorrelated sources of equal level (two noise
 * chains). A source must not be rendered by anyone else while the engine has it.
 *
 * <p><b>Underruns</b> are detected from progress, not from {@code available()} (which a PulseAudio
 * device behind ALSA reports wrongly): after each write the engine notes the time and how many
 * frames are still queued (frames written − the device's frame position); before the next write, if
 * the device's position has caught up with everything written, or more wall time has passed than
 * the queue could cover, the device ran dry once more.
 *
 * <p><b>Stalls.</b> A watchdog thread ({@link Watchdog}) watches the device's frame position; when it
 * does not move for the stall timeout, the engine records an {@link AudioDeviceException} of kind
 * {@link AudioDeviceException.Kind#STALLED} and closes the line, which frees a blocked write.
 */
public final class PlaybackEngine {
    /** Where the safety ramp starts, dB relative to the set level. */
    public static final double RAMP_FLOOR_DB = -60.0;
    private static final long LATE_SLACK_NANOS = TimeUnit.MILLISECONDS.toNanos(2);

    private final OutputLine line;
    private final PlaybackSettings settings;
    private final int channels;
    private final int rateHz;
    private final int blockFrames;
    private final double[] mix;
    private final double[] incomingBuffer;
    private final byte[] bytes;
    private final PcmCodec codec;
    private final long rampFrames;
    private final long fadeFrames;
    private final long crossfadeFrames;
    private final AtomicReference<FrameSource> pending = new AtomicReference<>();
    private final Thread renderThread;
    private final Watchdog watchdog;

    private volatile boolean stopRequested;
    private volatile boolean ended;
    private volatile AudioDeviceException failure;
    private volatile long framesWritten;
    private volatile long underruns;
    private volatile long clippedSamples;
    private volatile long lastSwitchFrame = -1;
    private volatile long switches;
    private volatile boolean started;
    private volatile boolean abandoned;

    // Render-thread state.
    private FrameSource current;
    private FrameSource incoming;
    private long crossfadePos;
    private long fadeOutPos = -1;
    private long lastWriteEndNanos;
    private long lastQueuedFrames = -1;
    private final double nanosPerFrame;

    /**
     * Prepares an engine on an open line; nothing plays until {@link #start()}.
     *
     * @param line     the output, open, not started
     * @param source   the first source; same channels and rate as the line
     * @param settings envelope, crossfade, watchdog and dither settings
     * @throws IllegalArgumentException if the source does not fit the line
     */
    public PlaybackEngine(OutputLine line, FrameSource source, PlaybackSettings settings) {
        this.line = Objects.requireNonNull(line, "line");
        this.settings = Objects.requireNonNull(settings, "settings");
        this.channels = line.channels();
        this.rateHz = line.sampleRateHz();
        checkFits(source);
        this.current = source;
        this.blockFrames = Math.max(16, Math.min(8192, line.bufferFrames() / 4));
        this.mix = new double[blockFrames * channels];
        this.incomingBuffer = new double[blockFrames * channels];
        this.codec = new PcmCodec(line.bitsPerSample(), settings.ditherSeed(), true);
        this.bytes = new byte[blockFrames * channels * codec.bytesPerSample()];
        this.rampFrames = Math.round(settings.safetyRampSeconds() * rateHz);
        this.fadeFrames = Math.round(settings.fadeSeconds() * rateHz);
        this.crossfadeFrames = Math.round(settings.crossfadeSeconds() * rateHz);
        this.nanosPerFrame = 1e9 / rateHz;
        this.renderThread = new Thread(this::renderLoop, "roseate-render " + line.deviceName());
        this.renderThread.setDaemon(true);
        this.renderThread.setPriority(Thread.MAX_PRIORITY);
        long timeout = (long) (settings.stallTimeoutSeconds() * 1e9);
        this.watchdog = new Watchdog("roseate-playback-watchdog", line::framePosition, timeout, this::onStall);
    }

    private void checkFits(FrameSource s) {
        Objects.requireNonNull(s, "source");
        if (s.channels() != channels || s.sampleRateHz() != rateHz) {
            throw new IllegalArgumentException("source with " + s.channels() + " channels at " + s.sampleRateHz()
                    + " Hz does not fit the line (" + channels + " channels at " + rateHz + " Hz)");
        }
    }

    /** Starts the line, the render thread and the watchdog. Call once. */
    public synchronized void start() {
        if (started) {
            throw new IllegalStateException("start() called twice");
        }
        started = true;
        renderThread.start();
        watchdog.start();
    }

    /**
     * Replaces the source at the next block boundary, with the crossfade. A later call before the
     * switch happened replaces the pending one. Safe from any thread.
     *
     * @throws IllegalArgumentException if the source's channels or rate differ from the line's
     */
    public void switchTo(FrameSource next) {
        checkFits(next);
        pending.set(next);
    }

    /**
     * Fades out, lets the device play what is queued (bounded by the buffer length plus a second),
     * closes the line and returns. Safe from any thread, also a shutdown hook; idempotent.
     */
    public void stop() {
        stopRequested = true;
        if (!started) {
            line.close();
            ended = true;
            return;
        }
        long budgetMillis = (long) (1000 * (settings.fadeSeconds() + settings.stallTimeoutSeconds()
                + (double) line.bufferFrames() / rateHz)) + 1000;
        try {
            renderThread.join(budgetMillis);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
        if (renderThread.isAlive()) {
            abandoned = true;
            line.close();
        }
        watchdog.stop();
    }

    /**
     * Waits up to the timeout for the engine to end by itself (only a failure ends it before {@link #stop()}).
     *
     * @return true if it has ended
     */
    public boolean awaitEnd(long timeout, TimeUnit unit) throws InterruptedException {
        if (!started) {
            return ended;
        }
        renderThread.join(Math.max(1, unit.toMillis(timeout)));
        return !renderThread.isAlive();
    }

    /** The device failure that ended playback, or null. */
    public AudioDeviceException failure() {
        return failure;
    }

    /** Throws the recorded failure, if any. */
    public void throwIfFailed() {
        AudioDeviceException f = failure;
        if (f != null) {
            throw f;
        }
    }

    /** Frames handed to the line so far. */
    public long framesWritten() {
        return framesWritten;
    }

    /** Underruns detected so far (see class notes). */
    public long underruns() {
        return underruns;
    }

    /** PCM samples clipped so far. */
    public long clippedSamples() {
        return clippedSamples;
    }

    /** The frame index at which the latest crossfade began, or −1. */
    public long lastSwitchFrame() {
        return lastSwitchFrame;
    }

    /** Crossfades begun so far. */
    public long switches() {
        return switches;
    }

    /** Frames per render block. */
    public int blockFrames() {
        return blockFrames;
    }

    /** Output latency from the line's buffer: buffer frames / rate, in ms. */
    public double latencyMs() {
        return 1000.0 * line.bufferFrames() / rateHz;
    }

    /**
     * The start envelope at a frame index: the safety ramp (linear in dB from {@link #RAMP_FLOOR_DB}
     * to 0 dB over {@code rampFrames}) times the start fade (linear from 0 over {@code fadeFrames}).
     * 1 from {@code rampFrames} on.
     */
    static double startGain(long frame, long rampFrames, long fadeFrames) {
        double g = 1.0;
        if (frame < rampFrames) {
            g = Math.exp(Math.log(10) / 20 * RAMP_FLOOR_DB * (1.0 - (double) frame / rampFrames));
        }
        if (frame < fadeFrames) {
            g *= (double) frame / fadeFrames;
        }
        return g;
    }

    private void onStall() {
        if (ended || (stopRequested && !renderThread.isAlive())) {
            return;
        }
        failure = new AudioDeviceException(AudioDeviceException.Kind.STALLED, line.deviceName(),
                "output device '" + line.deviceName() + "' stopped taking data (no progress for "
                        + settings.stallTimeoutSeconds() + " s)");
        line.close();
    }

    private void renderLoop() {
        try {
            // Fill the device buffer before starting it, so playback begins with a full queue
            // (started empty, a PulseAudio line behind ALSA reports positions ahead of the frames
            // written for its first buffer).
            int prefillBlocks = line.bufferFrames() / blockFrames;
            for (int k = 0; k < prefillBlocks && !stopRequested; k++) {
                if (!renderAndWrite(false)) {
                    return;
                }
            }
            line.start();
            while (failure == null && !abandoned) {
                if (stopRequested && fadeOutPos < 0) {
                    fadeOutPos = 0;
                }
                if (fadeOutPos >= 0 && fadeOutPos >= fadeFrames) {
                    break;
                }
                if (!renderAndWrite(true)) {
                    break;
                }
            }
            if (failure == null && !abandoned) {
                drain();
            }
        } finally {
            watchdog.stop();
            line.close();
            ended = true;
        }
    }

    /** Renders, encodes, checks for an underrun just before writing (if asked), writes. */
    private boolean renderAndWrite(boolean checkUnderrun) {
        renderBlock();
        codec.encode(mix, blockFrames * channels, bytes);
        clippedSamples = codec.clippedSamples();
        long written = framesWritten;
        if (checkUnderrun) {
            long now = System.nanoTime();
            long pos = line.framePosition();
            // A position beyond the frames written is not a reading to trust (see above).
            if (pos <= written && lastQueuedFrames >= 0) {
                long deadline = lastWriteEndNanos + (long) (lastQueuedFrames * nanosPerFrame) + LATE_SLACK_NANOS;
                if (pos == written || now > deadline) {
                    underruns = underruns + 1;
                }
            }
        }
        if (!writeAll()) {
            return false;
        }
        written += blockFrames;
        framesWritten = written;
        lastWriteEndNanos = System.nanoTime();
        long pos = line.framePosition();
        lastQueuedFrames = pos <= written ? written - pos : -1;
        return true;
    }

    private boolean writeAll() {
        int off = 0;
        int len = bytes.length;
        while (off < len) {
            int n = line.write(bytes, off, len - off);
            if (failure != null || abandoned) {
                return false;
            }
            if (n <= 0) {
                LockSupport.parkNanos(1_000_000L);
            }
            off += Math.max(0, n);
        }
        return true;
    }

    private void drain() {
        long limit = System.nanoTime() + (long) (1e9 * ((double) line.bufferFrames() / rateHz + 1.0));
        while (failure == null && line.framePosition() < framesWritten && System.nanoTime() < limit) {
            LockSupport.parkNanos(5_000_000L);
        }
    }

    private void renderBlock() {
        int n = blockFrames;
        int ch = channels;
        if (incoming == null) {
            FrameSource p = pending.getAndSet(null);
            if (p != null) {
                incoming = p;
                crossfadePos = 0;
                lastSwitchFrame = framesWritten;
                switches = switches + 1;
            }
        }
        current.render(mix, n);
        if (incoming != null) {
            incoming.render(incomingBuffer, n);
            double halfPi = Math.PI / 2;
            for (int f = 0; f < n; f++) {
                long k = crossfadePos + f;
                double t = crossfadeFrames == 0 ? 1.0 : Math.min(1.0, (double) k / crossfadeFrames);
                double a = Math.cos(halfPi * t);
                double b = t >= 1.0 ? 1.0 : Math.sin(halfPi * t);
                if (t >= 1.0) {
                    a = 0.0;
                }
                int base = f * ch;
                for (int c = 0; c < ch; c++) {
                    mix[base + c] = a * mix[base + c] + b * incomingBuffer[base + c];
                }
            }
            crossfadePos += n;
            if (crossfadePos >= crossfadeFrames) {
                current = incoming;
                incoming = null;
            }
        }
        long start = framesWritten;
        if (start < Math.max(rampFrames, fadeFrames) || fadeOutPos >= 0) {
            for (int f = 0; f < n; f++) {
                double g = startGain(start + f, rampFrames, fadeFrames);
                if (fadeOutPos >= 0) {
                    long k = fadeOutPos + f;
                    g *= fadeFrames == 0 || k >= fadeFrames ? 0.0 : 1.0 - (double) k / fadeFrames;
                }
                int base = f * ch;
                for (int c = 0; c < ch; c++) {
                    mix[base + c] *= g;
                }
            }
            if (fadeOutPos >= 0) {
                fadeOutPos += n;
            }
        }
    }
}
