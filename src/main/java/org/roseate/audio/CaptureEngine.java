package org.roseate.audio;

import be.tarsos.dsp.AudioDispatcher;
import be.tarsos.dsp.AudioEvent;
import be.tarsos.dsp.AudioProcessor;
import be.tarsos.dsp.io.jvm.JVMAudioInputStream;
import java.io.IOException;
import java.io.InputStream;
import java.util.Objects;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.locks.LockSupport;
import java.util.function.ObjIntConsumer;
import javax.sound.sampled.AudioInputStream;
import javax.sound.sampled.AudioSystem;

/**
 * Reads an {@link InputLine} on a dedicated capture thread into a preallocated ring of doubles
 * (full scale 1.0, interleaved) for one consumer: the analyzer, a WAV writer, a test.
 *
 * <p>The capture thread runs a TarsosDSP {@link AudioDispatcher}: its input is a
 * {@link JVMAudioInputStream} over a Java Sound {@link AudioInputStream} that reads the line (for a
 * sound card, the {@code TargetDataLine} {@link Devices#openInput} opened on the device the user
 * chose), in blocks of a quarter of the line's buffer (16 to 8192 frames, no overlap). One
 * {@link AudioProcessor} on the dispatcher, the ring writer, decodes each block exactly
 * ({@link PcmCodec#decode}) and appends it to the ring. It decodes the raw PCM bytes the dispatcher
 * read, not the event's float buffer: TarsosDSP 2.4 sizes that buffer in samples but reads its byte
 * buffer in frames, so for stereo the floats hold only the first half of each block, and
 * {@link AudioEvent#getByteBuffer()} re-encodes those floats rather than returning what was read
 * (both checked in the library's bytecode, and the first in {@code CaptureEngineTest}). The bytes
 * are taken where the dispatcher hands its buffer to the stream's {@code read}.
 *
 * <p>The consumers (the live analyzer feed, the WAV capture writer) do FFTs and file I/O, so they do
 * not run on the capture thread: they take blocks from the ring on a thread of their own.
 *
 * <p>On the capture thread our code allocates nothing, takes no lock of ours, logs nothing and
 * touches no file. TarsosDSP's dispatcher loop, in the steady state, allocates one iterator over its
 * processor list per block (a {@code CopyOnWriteArrayList} iterator: 24 bytes per block measured on
 * JDK 17 with compressed references, {@code CaptureEngineTest}) and converts each block to floats
 * that nothing reads; the dispatcher's own log calls happen only on a read error. The ring is single-producer
 * single-consumer: the producer publishes a volatile write count after the samples, the consumer a
 * volatile read count after taking them. When the consumer falls behind by the whole ring, the
 * newest block is dropped and counted ({@link #droppedFrames()}); the ring is never overwritten
 * under a reader.
 *
 * <p>Consume by polling ({@link #read}) or by a callback on a thread of its own ({@link #deliverTo}).
 *
 * <p>Stalls are caught as in playback: a {@link Watchdog} watches the frames read from the device,
 * and when they stop growing for the timeout it records an {@link AudioDeviceException} of kind
 * STALLED and closes the line, which frees a blocked read; the stream then reports its end, which
 * ends the dispatcher. (A stream straight over a closed {@code TargetDataLine} would instead return
 * 0 bytes for ever and keep the dispatcher spinning; that is why the stream is ours.)
 */
public final class CaptureEngine {
    private final InputLine line;
    private final int channels;
    private final int blockFrames;
    private final int frameBytes;
    private final double[] block;
    private final double[] ring;
    private final int ringFrames;
    private final double stallTimeoutSeconds;
    private final Thread captureThread;
    private final Watchdog watchdog;
    private final LineStream lineStream;
    private final AudioDispatcher dispatcher;

    private volatile long writeCount;
    private volatile long readCount;
    private volatile long framesFromDevice;
    private volatile long droppedFrames;
    private volatile boolean stopRequested;
    private volatile boolean ended;
    private volatile AudioDeviceException failure;
    private boolean started;

    /**
     * Prepares capture on an open line; nothing is read until {@link #start()}.
     *
     * @param line                the input, open, not started
     * @param ringFrames          ring capacity in frames, ≥ 4 blocks (e.g. 2 s of audio)
     * @param stallTimeoutSeconds no data for this long is a stall, &gt; 0
     * @throws IllegalArgumentException if the ring is smaller than four blocks or the timeout is not positive
     */
    public CaptureEngine(InputLine line, int ringFrames, double stallTimeoutSeconds) {
        this.line = Objects.requireNonNull(line, "line");
        this.channels = line.channels();
        this.blockFrames = Math.max(16, Math.min(8192, line.bufferFrames() / 4));
        if (ringFrames < 4 * blockFrames) {
            throw new IllegalArgumentException("ringFrames=" + ringFrames + " must be >= 4 blocks (" + 4 * blockFrames + ")");
        }
        if (!(stallTimeoutSeconds > 0)) {
            throw new IllegalArgumentException("stallTimeoutSeconds=" + stallTimeoutSeconds + " must be > 0");
        }
        this.stallTimeoutSeconds = stallTimeoutSeconds;
        this.ringFrames = ringFrames;
        this.ring = new double[ringFrames * channels];
        this.block = new double[blockFrames * channels];
        this.frameBytes = channels * (line.bitsPerSample() / 8);
        this.lineStream = new LineStream();
        AudioInputStream pcm = new AudioInputStream(lineStream,
                Devices.format(line.sampleRateHz(), channels, line.bitsPerSample()), AudioSystem.NOT_SPECIFIED);
        this.dispatcher = new AudioDispatcher(new JVMAudioInputStream(pcm), blockFrames, 0);
        this.dispatcher.addAudioProcessor(new RingWriter());
        this.captureThread = new Thread(this::captureLoop, "roseate-capture " + line.deviceName());
        this.captureThread.setDaemon(true);
        this.captureThread.setPriority(Thread.MAX_PRIORITY);
        this.watchdog = new Watchdog("roseate-capture-watchdog", () -> framesFromDevice,
                (long) (stallTimeoutSeconds * 1e9), this::onStall);
    }

    /** Channels per frame. */
    public int channels() {
        return channels;
    }

    /** Sample rate in Hz. */
    public int sampleRateHz() {
        return line.sampleRateHz();
    }

    /** Starts the line, the capture thread and the watchdog. Call once. */
    public synchronized void start() {
        if (started) {
            throw new IllegalStateException("start() called twice");
        }
        started = true;
        line.start();
        captureThread.start();
        watchdog.start();
    }

    /** Stops capture and closes the line; frames already in the ring can still be read. Idempotent. */
    public void stop() {
        stopRequested = true;
        watchdog.stop();
        line.close();
        if (started) {
            try {
                captureThread.join(2000);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
        }
        ended = true;
    }

    /**
     * Copies up to {@code maxFrames} captured frames into {@code dst} (interleaved) without waiting.
     * For the one consumer thread.
     *
     * @return frames copied, 0 if none are waiting
     */
    public int read(double[] dst, int maxFrames) {
        long w = writeCount;
        long r = readCount;
        int n = (int) Math.min(maxFrames, w - r);
        if (n <= 0) {
            return 0;
        }
        int start = (int) (r % ringFrames);
        int first = Math.min(n, ringFrames - start);
        System.arraycopy(ring, start * channels, dst, 0, first * channels);
        if (first < n) {
            System.arraycopy(ring, 0, dst, first * channels, (n - first) * channels);
        }
        readCount = r + n;
        return n;
    }

    /**
     * As {@link #read(double[], int)}, waiting up to the timeout for at least one frame.
     *
     * @return frames copied; 0 on timeout or when capture has ended and the ring is empty
     */
    public int read(double[] dst, int maxFrames, long timeout, TimeUnit unit) {
        long deadline = System.nanoTime() + unit.toNanos(timeout);
        while (true) {
            int n = read(dst, maxFrames);
            if (n > 0 || hasEnded() || System.nanoTime() >= deadline) {
                return n > 0 ? n : read(dst, maxFrames);
            }
            LockSupport.parkNanos(1_000_000L);
        }
    }

    /**
     * Starts a thread that hands every captured block to {@code consumer} (interleaved doubles and a
     * frame count; the array is reused, copy what you keep) until {@link Delivery#finish()}. The
     * consumer runs on that thread, never on the capture thread, so it may do file I/O.
     */
    public Delivery deliverTo(ObjIntConsumer<double[]> consumer) {
        Objects.requireNonNull(consumer, "consumer");
        Delivery d = new Delivery(consumer);
        d.thread.start();
        return d;
    }

    /** A running callback delivery. */
    public final class Delivery {
        private final Thread thread;
        private volatile boolean finishing;
        private volatile RuntimeException error;

        private Delivery(ObjIntConsumer<double[]> consumer) {
            double[] buf = new double[blockFrames * channels];
            thread = new Thread(() -> {
                try {
                    while (true) {
                        int n = read(buf, blockFrames, 20, TimeUnit.MILLISECONDS);
                        if (n > 0) {
                            consumer.accept(buf, n);
                        } else if (finishing || hasEnded()) {
                            return;
                        }
                    }
                } catch (RuntimeException e) {
                    error = e;
                }
            }, "roseate-capture-delivery");
            thread.setDaemon(true);
        }

        /** Delivers what is left in the ring, then ends the thread; rethrows the consumer's exception. */
        public void finish() {
            finishing = true;
            try {
                thread.join();
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
            if (error != null) {
                throw error;
            }
        }
    }

    /** Frames appended to the ring so far. */
    public long framesCaptured() {
        return writeCount;
    }

    /** Frames dropped because the consumer was a whole ring behind. */
    public long droppedFrames() {
        return droppedFrames;
    }

    /** The device failure that ended capture, or null. */
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

    private boolean hasEnded() {
        return ended || (started && !captureThread.isAlive());
    }

    private void onStall() {
        if (stopRequested) {
            return;
        }
        failure = new AudioDeviceException(AudioDeviceException.Kind.STALLED, line.deviceName(),
                "input device '" + line.deviceName() + "' stopped giving data (no progress for "
                        + stallTimeoutSeconds + " s)");
        line.close();
    }

    private void captureLoop() {
        try {
            dispatcher.run();
        } finally {
            watchdog.stop();
            line.close();
            ended = true;
        }
    }

    /**
     * The bytes under the dispatcher: reads the line, remembers the dispatcher's byte buffer and how
     * much of the current block has arrived, and reports the end of the stream once capture is
     * stopped or has failed. Used only on the capture thread.
     */
    private final class LineStream extends InputStream {
        private byte[] blockBytes;
        private int blockLength;

        @Override
        public int read(byte[] b, int off, int len) {
            if (stopRequested || failure != null) {
                return -1;
            }
            int n = line.read(b, off, len);
            if (stopRequested || failure != null) {
                return -1;
            }
            if (n <= 0) {
                LockSupport.parkNanos(1_000_000L);
                return 0;
            }
            // The dispatcher reads each block into its byte buffer from offset 0 (no overlap).
            blockBytes = b;
            blockLength = off + n;
            framesFromDevice = framesFromDevice + n / frameBytes;
            return n;
        }

        @Override
        public int read() throws IOException {
            throw new IOException("the capture stream reads whole frames only");
        }

        @Override
        public void close() {
            line.close();
        }
    }

    /** The dispatcher's one processor: decodes the block's raw bytes into the ring. */
    private final class RingWriter implements AudioProcessor {
        @Override
        public boolean process(AudioEvent event) {
            int frames = lineStream.blockLength / frameBytes;
            lineStream.blockLength = 0;
            if (frames == 0) {
                return true;
            }
            PcmCodec.decode(lineStream.blockBytes, 0, frames * channels, line.bitsPerSample(), block, 0);
            long w = writeCount;
            if (w + frames - readCount > ringFrames) {
                droppedFrames = droppedFrames + frames;
                return true;
            }
            int start = (int) (w % ringFrames);
            int first = Math.min(frames, ringFrames - start);
            System.arraycopy(block, 0, ring, start * channels, first * channels);
            if (first < frames) {
                System.arraycopy(block, first * channels, ring, 0, (frames - first) * channels);
            }
            writeCount = w + frames;
            return true;
        }

        @Override
        public void processingFinished() {
            // Nothing to flush: every block is in the ring when process returns.
        }
    }
}
