package org.roseate.app;

import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.atomic.AtomicReference;
import org.roseate.audio.AudioDeviceException;
import org.roseate.audio.CaptureEngine;
import org.roseate.audio.InputLine;
import org.roseate.io.AtomicOutput;
import org.roseate.io.SampleEncoding;
import org.roseate.io.WavFormat;
import org.roseate.io.WavWriter;
import org.roseate.measure.MeasureException;
import org.roseate.measure.MeasurePipeline;
import org.roseate.measure.MeasureResult;

/**
 * A measurement from a sound-card input: the core's {@link CaptureEngine} fills its ring on the
 * capture thread; its delivery thread feeds the core's {@link MeasurePipeline} (the same one files go
 * through), keeps a copy of the audio (up to {@link #MAX_KEEP_SECONDS}) for saving, and publishes an
 * immutable {@link MeasureResult} after each new segment. The UI polls {@link #latest()}.
 */
final class LiveMeasurement implements AutoCloseable {
    /** Longest capture kept for "Save capture", s (2 min of stereo at 48 kHz is 46 MB of floats). */
    static final double MAX_KEEP_SECONDS = 120;

    private final CaptureEngine engine;
    private final CaptureEngine.Delivery delivery;
    private final AtomicReference<Restart> pending = new AtomicReference<>();
    private volatile long requestedGeneration;
    private long generation;
    private final int sampleRateHz;
    private final int channels;
    private final double codeFs;
    private MeasurePipeline analyzer;
    /** A result and the analysis (counted from 0, one more per restart) it came from. */
    private record Tagged(long generation, MeasureResult result) {
    }

    /** A new analysis waiting for the delivery thread. */
    private record Restart(long generation, MeasurePipeline pipeline) {
    }

    private final AtomicReference<Tagged> latest = new AtomicReference<>();
    private final AtomicReference<String> problem = new AtomicReference<>();
    private final List<float[]> kept = new ArrayList<>();
    private final long maxKeptSamples;
    private final String name;
    private volatile long keptSamples;
    private long lastAverages;

    /**
     * Starts capturing from an opened line.
     *
     * @throws org.roseate.measure.MeasureException when the setup does not fit the line (channels, rate)
     */
    LiveMeasurement(InputLine line, MeasureSetup setup) {
        this.name = line.deviceName();
        this.sampleRateHz = line.sampleRateHz();
        this.channels = line.channels();
        this.codeFs = Math.scalb(1.0, -(line.bitsPerSample() - 1));
        this.analyzer = new MeasurePipeline(setup.request(), name, sampleRateHz, channels, codeFs);
        this.maxKeptSamples = (long) (MAX_KEEP_SECONDS * line.sampleRateHz()) * line.channels();
        this.engine = new CaptureEngine(line, Math.max(2 * line.sampleRateHz(), 64 * 1024), 2.0);
        engine.start();
        this.delivery = engine.deliverTo(this::accept);
    }

    private void accept(double[] interleaved, int frames) {
        int n = frames * engine.channels();
        if (keptSamples + n <= maxKeptSamples) {
            float[] copy = new float[n];
            for (int i = 0; i < n; i++) {
                copy[i] = (float) interleaved[i];
            }
            synchronized (kept) {
                kept.add(copy);
            }
            keptSamples += n;
        }
        Restart next = pending.getAndSet(null);
        if (next != null) {
            analyzer = next.pipeline();
            generation = next.generation();
            lastAverages = 0;
        }
        if (problem.get() != null) {
            return;
        }
        try {
            analyzer.accept(interleaved, frames);
            if (analyzer.averages() != lastAverages) {
                lastAverages = analyzer.averages();
                MeasureResult r = analyzer.result(false);
                if (r != null) {
                    latest.set(new Tagged(generation, r));
                }
            }
        } catch (MeasureException e) {
            problem.set(e.getMessage());
        }
    }

    /**
     * Starts the averaging again from the next captured block, with a new setup (the same line):
     * the reading so far is dropped ({@link #latest()} is null until the first new segment).
     *
     * @throws org.roseate.measure.MeasureException when the setup does not fit the line
     */
    synchronized void restartAnalysis(MeasureSetup setup) {
        MeasurePipeline p = new MeasurePipeline(setup.request(), name, sampleRateHz, channels, codeFs);
        long g = requestedGeneration + 1;
        pending.set(new Restart(g, p));
        requestedGeneration = g;
    }

    /** The newest result of the current analysis (since the last restart), or null. */
    MeasureResult latest() {
        Tagged t = latest.get();
        return t == null || t.generation() != requestedGeneration ? null : t.result();
    }

    /** A device failure or analysis problem, one line, or null. */
    String problem() {
        AudioDeviceException f = engine.failure();
        return f != null ? f.getMessage() : problem.get();
    }

    double keptSeconds() {
        return keptSamples / (double) engine.channels() / engine.sampleRateHz();
    }

    /** Writes the audio kept so far as 24-bit PCM WAV, atomically. */
    void saveCapture(Path file) throws IOException {
        List<float[]> blocks;
        synchronized (kept) {
            blocks = new ArrayList<>(kept);
        }
        int ch = engine.channels();
        long frames = 0;
        for (float[] b : blocks) {
            frames += b.length / ch;
        }
        try (AtomicOutput o = AtomicOutput.open(file, true)) {
            WavWriter w = new WavWriter(o.stream(), new WavFormat(engine.sampleRateHz(), ch, SampleEncoding.PCM_24), frames, 1L);
            double[] buf = new double[0];
            for (float[] b : blocks) {
                if (buf.length < b.length) {
                    buf = new double[b.length];
                }
                for (int i = 0; i < b.length; i++) {
                    buf[i] = b[i];
                }
                w.writeFrames(buf, b.length / ch);
            }
            w.finish();
            o.commit();
        }
    }

    /** Stops capture; the last result stays readable. */
    @Override
    public void close() {
        engine.stop();
        try {
            delivery.finish();
        } catch (RuntimeException e) {
            problem.set(name + ": " + e.getMessage());
        }
    }
}
