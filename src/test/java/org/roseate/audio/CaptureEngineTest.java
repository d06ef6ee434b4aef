package org.roseate.audio;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import be.tarsos.dsp.AudioDispatcher;
import be.tarsos.dsp.AudioEvent;
import be.tarsos.dsp.AudioProcessor;
import be.tarsos.dsp.io.jvm.JVMAudioInputStream;
import java.io.ByteArrayInputStream;
import java.io.ByteArrayOutputStream;
import java.lang.management.ManagementFactory;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import javax.sound.sampled.AudioInputStream;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.roseate.io.SampleEncoding;
import org.roseate.io.WavFormat;
import org.roseate.io.WavReader;

class CaptureEngineTest {
    /** An input giving a 16-bit ramp of codes 0, 1, 2, … (one per sample), then nothing after {@code stallAfterFrames}. */
    static final class RampInput implements InputLine {
        final int channels;
        final long stallAfterFrames;
        final CountDownLatch closed = new CountDownLatch(1);
        volatile long frames;
        int code;

        RampInput(int channels, long stallAfterFrames) {
            this.channels = channels;
            this.stallAfterFrames = stallAfterFrames;
        }

        @Override public String deviceName() { return "fake-in"; }
        @Override public int sampleRateHz() { return 48000; }
        @Override public int channels() { return channels; }
        @Override public int bitsPerSample() { return 16; }
        @Override public int bufferFrames() { return 1024; }
        @Override public void start() { }
        @Override public long framePosition() { return frames; }
        @Override public void close() { closed.countDown(); }

        @Override
        public int read(byte[] b, int off, int len) {
            int n = len / (2 * channels);
            if (closed.getCount() == 0) {
                return 0;
            }
            if (frames + n > stallAfterFrames) {
                try {
                    closed.await();
                } catch (InterruptedException e) {
                    Thread.currentThread().interrupt();
                }
                return 0;
            }
            for (int i = 0; i < n * channels; i++) {
                short q = (short) code++;
                b[off + 2 * i] = (byte) q;
                b[off + 2 * i + 1] = (byte) (q >> 8);
            }
            frames += n;
            return n * 2 * channels;
        }
    }

    @Test
    void deliversEverySampleInOrderThroughTheRingThenCatchesTheStall() throws Exception {
        RampInput in = new RampInput(2, 20_000);
        // The fake gives its 20 000 frames at once; a ring larger than that never has to drop.
        CaptureEngine e = new CaptureEngine(in, 32768, 0.3);
        e.start();
        double[] got = new double[40_000 * 2];
        int n = 0;
        double[] buf = new double[777 * 2]; // an odd size, unrelated to the block
        long t0 = System.nanoTime();
        while (System.nanoTime() - t0 < 3_000_000_000L && e.failure() == null || n < e.framesCaptured()) {
            int k = e.read(buf, 777, 10, TimeUnit.MILLISECONDS);
            System.arraycopy(buf, 0, got, n * 2, k * 2);
            n += k;
        }
        AudioDeviceException f = e.failure();
        assertNotNull(f, "the stalled input must be reported");
        assertEquals(AudioDeviceException.Kind.STALLED, f.kind());
        assertTrue(f.getMessage().contains("'fake-in'"), f.getMessage());
        assertEquals(0, e.droppedFrames(), "a ring that holds everything drops nothing");
        assertEquals(in.frames, n, "every frame the device gave was delivered");
        // The stall closed the line; the stream under the dispatcher reports its end and the capture
        // thread finishes on its own (it does not spin on a closed line). 2 s: generous for a thread
        // that only has to return from one read.
        long t1 = System.nanoTime();
        while (captureThreadAlive("fake-in") && System.nanoTime() - t1 < 2_000_000_000L) {
            Thread.sleep(10);
        }
        assertTrue(!captureThreadAlive("fake-in"), "the capture thread ends after a stall");
        for (int i = 0; i < n * 2; i++) {
            // code / 32768 (the package's sample convention), codes counting up and wrapping at 16 bits
            assertEquals((short) i / 32768.0, got[i], 0.0, "sample " + i);
        }
        e.stop();
    }

    @Test
    void aRingTooSmallDropsWholeBlocksAndCountsThem() throws Exception {
        RampInput in = new RampInput(1, 20_000);
        CaptureEngine e = new CaptureEngine(in, 1024, 0.3);
        e.start();
        PlaybackEngineTest.waitFor(() -> e.failure() == null ? 0 : 1, 1, 5000);
        assertEquals(in.frames, e.framesCaptured() + e.droppedFrames());
        assertTrue(e.droppedFrames() > 0);
        double[] buf = new double[1024];
        int k = e.read(buf, 1024);
        assertEquals(1024, k, "the ring is full of the oldest frames, not overwritten");
        for (int i = 0; i < k; i++) {
            assertEquals(i / 32768.0, buf[i], 0.0);
        }
        e.stop();
    }

    @Test
    void savedCaptureIsTheSamplesUnchanged(@org.junit.jupiter.api.io.TempDir java.nio.file.Path dir) throws Exception {
        RampInput in = new RampInput(1, Long.MAX_VALUE);
        CaptureEngine e = new CaptureEngine(in, 8192, 2.0);
        ByteArrayOutputStream bytes = new ByteArrayOutputStream();
        WavCaptureSink sink = new WavCaptureSink(bytes, new WavFormat(48000, 1, SampleEncoding.PCM_16), 5000);
        e.start();
        CaptureEngine.Delivery d = e.deliverTo(sink);
        PlaybackEngineTest.waitFor(sink::framesReceived, 5000, 5000);
        e.stop();
        d.finish();
        assertEquals(5000, sink.finish());
        java.nio.file.Path file = dir.resolve("cap.wav");
        java.nio.file.Files.write(file, bytes.toByteArray());
        try (WavReader r = WavReader.open(file)) {
            double[] x = new double[5000];
            assertEquals(5000, r.readFrames(x, 5000));
            for (int i = 0; i < 5000; i++) {
                assertEquals(i / 32768.0, x[i], 0.0, "sample " + i);
            }
        }
    }

    /**
     * Why the engine decodes the raw bytes: in TarsosDSP 2.4 a dispatcher of buffer size N reads N
     * frames of bytes per block but converts only N samples to floats, so for stereo the event's
     * float buffer holds the first half of each block and the second half is never seen there.
     * It also scales 16-bit codes by 1/32767 where this package uses 1/32768.
     * (Read from the library's bytecode: {@code setStepSizeAndOverlap} allocates {@code float[N]} and
     * {@code byte[N * frameSize]}; this checks the consequence.)
     */
    @Test
    void tarsosFloatBufferHoldsOnlyTheFirstHalfOfAStereoBlock() {
        int blockFrames = 64;
        int blocks = 3;
        short[] codes = new short[blocks * blockFrames * 2];
        byte[] pcm = new byte[codes.length * 2];
        for (int i = 0; i < codes.length; i++) {
            codes[i] = (short) (100 * i);
            pcm[2 * i] = (byte) codes[i];
            pcm[2 * i + 1] = (byte) (codes[i] >> 8);
        }
        AudioInputStream stream = new AudioInputStream(new ByteArrayInputStream(pcm), Devices.format(48000, 2, 16),
                codes.length / 2);
        AudioDispatcher d = new AudioDispatcher(new JVMAudioInputStream(stream), blockFrames, 0);
        List<float[]> seen = new ArrayList<>();
        d.addAudioProcessor(new AudioProcessor() {
            @Override public boolean process(AudioEvent e) {
                seen.add(e.getFloatBuffer().clone());
                return true;
            }

            @Override public void processingFinished() { }
        });
        d.run();
        assertEquals(blocks, seen.size(), "one event per block of " + blockFrames + " frames");
        for (int b = 0; b < blocks; b++) {
            float[] f = seen.get(b);
            assertEquals(blockFrames, f.length, "floats per event: one per frame, not one per sample");
            int first = b * blockFrames * 2;
            for (int k = 0; k < f.length; k++) {
                // The library scales 16-bit codes by 1/32767 (not the package's 1/32768, a second reason
                // to decode the bytes ourselves), so recover the code by that scale.
                assertEquals(codes[first + k], Math.round(f[k] * 32767.0), "block " + b + " float " + k);
            }
        }
    }

    /**
     * What the capture thread allocates in its steady state, read from the JVM's per-thread
     * allocation counter: our code nothing, TarsosDSP's dispatcher loop one iterator over its
     * processor list per block (a {@code CopyOnWriteArrayList} iterator: 24 bytes with compressed
     * references, more without; the JIT may remove it). The bound of 64 bytes per block leaves room
     * for that iterator on any 64-bit layout and fails for any array or event allocated per block.
     */
    @Test
    void captureThreadAllocatesAtMostTheDispatchersIteratorPerBlock() throws Exception {
        com.sun.management.ThreadMXBean mx = (com.sun.management.ThreadMXBean) ManagementFactory.getThreadMXBean();
        RampInput in = new RampInput(2, Long.MAX_VALUE);
        CaptureEngine e = new CaptureEngine(in, 8192, 5.0);
        e.start();
        Thread t = null;
        for (Map.Entry<Thread, StackTraceElement[]> en : Thread.getAllStackTraces().entrySet()) {
            if (en.getKey().getName().equals("roseate-capture fake-in")) {
                t = en.getKey();
            }
        }
        assertNotNull(t, "capture thread");
        double[] buf = new double[8192 * 2];
        // Warm up: let the JIT compile the loop, then measure while a reader keeps the ring moving.
        long warmEnd = System.nanoTime() + 1_000_000_000L;
        while (System.nanoTime() < warmEnd) {
            e.read(buf, 8192);
        }
        long bytes0 = mx.getThreadAllocatedBytes(t.getId());
        long frames0 = e.framesCaptured() + e.droppedFrames();
        long end = System.nanoTime() + 500_000_000L;
        while (System.nanoTime() < end) {
            e.read(buf, 8192);
        }
        long bytes1 = mx.getThreadAllocatedBytes(t.getId());
        long frames1 = e.framesCaptured() + e.droppedFrames();
        e.stop();
        long blocks = (frames1 - frames0) / 256; // bufferFrames() 1024 / 4
        assertTrue(blocks > 1000, "enough blocks to measure: " + blocks);
        double perBlock = (bytes1 - bytes0) / (double) blocks;
        System.out.printf("capture thread: %.2f bytes allocated per block over %d blocks%n", perBlock, blocks);
        assertTrue(perBlock <= 64, perBlock + " bytes per block");
    }

    private static boolean captureThreadAlive(String device) {
        return Thread.getAllStackTraces().keySet().stream()
                .anyMatch(t -> t.getName().equals("roseate-capture " + device) && t.isAlive());
    }
}
