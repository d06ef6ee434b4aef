package org.roseate.app;

import java.util.List;
import java.util.concurrent.atomic.AtomicReference;
import java.util.concurrent.locks.LockSupport;
import org.roseate.bands.BandTable;
import org.roseate.spectrum.BandLevel;
import org.roseate.spectrum.BandLevels;
import org.roseate.spectrum.SpectralDensity;
import org.roseate.spectrum.WelchEstimator;
import org.roseate.spectrum.WelchSettings;

/**
 * The live band meter of what is playing: an analysis thread drains a {@link MeterRing} into a
 * {@link WelchEstimator} (exponential averaging) and, after each new segment, publishes an
 * immutable {@link Snapshot} of the band levels. The UI reads {@link #latest()} at display rate;
 * nobody waits for anybody.
 *
 * <p>Resolution: {@link #segmentLength} samples per segment (16384 at 48 kHz: 2.9 Hz bins, a new
 * reading every 85 ms at 75 % overlap). The lowest third-octave bands then span fewer than the
 * eight bins the measure view insists on ({@link BandLevels#MIN_BINS_PER_BAND}); for a meter of a
 * known noise that is a fair trade for a quick display, and each reading says its bins.
 */
final class BandMeter implements AutoCloseable {
    /** Time constant of the exponential average, segments (about 0.7 s at 48 kHz). */
    static final int TIME_CONSTANT_SEGMENTS = 8;

    /**
     * One published reading.
     *
     * @param sequence  increases with every reading
     * @param levels    band levels in dBFS with their uncertainty
     * @param averages  segments averaged so far
     * @param dropped   samples the meter missed because it fell behind
     */
    record Snapshot(long sequence, List<BandLevel> levels, long averages, long dropped) {
        Snapshot {
            levels = List.copyOf(levels);
        }
    }

    private final MeterRing ring;
    private final BandTable table;
    private final WelchEstimator estimator = new WelchEstimator();
    private final AtomicReference<Snapshot> latest = new AtomicReference<>();
    private final Thread thread;
    private final int segmentLength;
    private volatile boolean running = true;
    private volatile boolean resetRequested;

    BandMeter(MeterRing ring, double sampleRateHz, BandTable table) {
        this.ring = ring;
        this.table = table;
        this.segmentLength = segmentLength(sampleRateHz);
        estimator.prepare(sampleRateHz, WelchSettings.of(segmentLength).withOverlap(0.75)
                .exponential(TIME_CONSTANT_SEGMENTS));
        thread = new Thread(this::loop, "roseate-band-meter");
        thread.setDaemon(true);
    }

    /** 16384 at 44.1/48 kHz, scaled with the rate to keep about 2.9 Hz bins; a power of two. */
    static int segmentLength(double sampleRateHz) {
        int n = 1024;
        while (n < sampleRateHz / 3) {
            n *= 2;
        }
        return n;
    }

    BandMeter start() {
        thread.start();
        return this;
    }

    /** Forget the average (after switching to another source). */
    void reset() {
        resetRequested = true;
    }

    Snapshot latest() {
        return latest.get();
    }

    private void loop() {
        double[] buf = new double[4096];
        long lastAverages = 0;
        long seq = 0;
        while (running) {
            if (resetRequested) {
                resetRequested = false;
                estimator.reset();
                lastAverages = 0;
            }
            int n = ring.read(buf, buf.length);
            if (n == 0) {
                LockSupport.parkNanos(5_000_000L);
                continue;
            }
            estimator.accept(buf, 0, n);
            long a = estimator.averages();
            if (a != lastAverages && a > 0) {
                lastAverages = a;
                SpectralDensity d = estimator.snapshot();
                latest.set(new Snapshot(++seq, BandLevels.of(d, table), a, ring.dropped()));
            }
        }
    }

    @Override
    public void close() {
        running = false;
        try {
            thread.join(1000);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
    }
}
