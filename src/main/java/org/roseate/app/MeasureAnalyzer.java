package org.roseate.app;

import org.roseate.bands.BandTable;
import org.roseate.compare.LogGrid;
import org.roseate.spectrum.BandLevels;
import org.roseate.spectrum.CrossSpectrumEstimator;
import org.roseate.spectrum.NoiseSourceResult;
import org.roseate.spectrum.TransferEstimate;
import org.roseate.spectrum.TransferResult;
import org.roseate.spectrum.WelchEstimator;

/**
 * Feeds interleaved frames into the core's Welch estimators and turns their state into results,
 * as the {@code measure} command does: the segment length from {@link BandLevels#autoSegmentLength}
 * (the lowest band at least eight bins wide), band levels by {@link NoiseSourceResult} or
 * {@link TransferResult} with a 20-per-decade response grid. One thread feeds it; {@link #result}
 * returns an immutable outcome to publish.
 */
final class MeasureAnalyzer {
    /** Response points per decade in transfer mode, as the command's default. */
    static final int RESPONSE_POINTS_PER_DECADE = 20;

    private final MeasureSetup setup;
    private final BandTable table;
    private final double sampleRateHz;
    private final int channels;
    private final int segmentLength;
    private final WelchEstimator noise;
    private final CrossSpectrumEstimator cross;
    private long frames;

    /**
     * @throws IllegalArgumentException naming the problem: a channel the source lacks, a transfer
     *                                  on one channel, bands above Nyquist, a calibration at another rate
     */
    MeasureAnalyzer(MeasureSetup setup, double sampleRateHz, int channels) {
        this.setup = setup;
        this.table = setup.analysis().table();
        this.sampleRateHz = sampleRateHz;
        this.channels = channels;
        if (setup.mode() == MeasureSetup.Mode.TRANSFER && channels < 2) {
            throw new IllegalArgumentException("a transfer measurement needs two channels (reference and response); the source has 1");
        }
        check(setup.responseChannel(), "response");
        if (setup.mode() == MeasureSetup.Mode.TRANSFER) {
            check(setup.referenceChannel(), "reference");
            if (setup.referenceChannel() == setup.responseChannel()) {
                throw new IllegalArgumentException("reference and response are both channel " + (setup.responseChannel() + 1));
            }
        }
        if (sampleRateHz / 2 <= table.band(0).lowHz()) {
            throw new IllegalArgumentException("every band lies above the Nyquist frequency " + sampleRateHz / 2 + " Hz");
        }
        if (setup.calibration() != null && setup.mode() == MeasureSetup.Mode.TRANSFER) {
            setup.calibration().checkRate(sampleRateHz);
        }
        segmentLength = BandLevels.autoSegmentLength(sampleRateHz, table);
        if (setup.mode() == MeasureSetup.Mode.NOISE_SOURCE) {
            noise = new WelchEstimator();
            noise.prepare(sampleRateHz, setup.welch(segmentLength));
            cross = null;
        } else {
            cross = new CrossSpectrumEstimator();
            cross.prepare(sampleRateHz, setup.welch(segmentLength));
            noise = null;
        }
    }

    private void check(int channel, String what) {
        if (channel >= channels) {
            throw new IllegalArgumentException("the " + what + " channel " + (channel + 1) + " is out of range; the source has "
                    + channels + (channels == 1 ? " channel" : " channels"));
        }
    }

    int segmentLength() {
        return segmentLength;
    }

    double sampleRateHz() {
        return sampleRateHz;
    }

    void accept(double[] interleaved, int frameCount) {
        if (noise != null) {
            noise.acceptInterleaved(interleaved, frameCount, channels, setup.responseChannel());
        } else {
            cross.acceptInterleaved(interleaved, frameCount, channels, setup.referenceChannel(), setup.responseChannel());
        }
        frames += frameCount;
    }

    long averages() {
        return noise != null ? noise.averages() : cross.averages();
    }

    /** The result so far, or null before the first complete segment. */
    MeasureOutcome result(String source, boolean complete) {
        if (averages() == 0) {
            return null;
        }
        double seconds = frames / sampleRateHz;
        if (noise != null) {
            NoiseSourceResult r = NoiseSourceResult.of(noise.snapshot(), table, setup.analysis().target(), setup.design());
            return new MeasureOutcome(source, r, null, null, seconds, complete);
        }
        TransferEstimate raw = cross.snapshot().transfer();
        TransferEstimate h = setup.calibration() == null ? raw : setup.calibration().apply(raw);
        double lo = Math.max(setup.analysis().range().loHz(), raw.binWidthHz());
        double hi = Math.min(setup.analysis().range().hiHz(), sampleRateHz / 2);
        double[] hz = LogGrid.points(lo, hi, RESPONSE_POINTS_PER_DECADE);
        TransferResult r = TransferResult.of(h, hz, TransferResult.DEFAULT_COHERENCE_THRESHOLD, table,
                setup.analysis().target(), setup.design());
        return new MeasureOutcome(source, null, r, raw, seconds, complete);
    }
}
