package org.roseate.measure;

import java.util.List;
import java.util.Locale;
import org.roseate.bands.BandTable;
import org.roseate.spectrum.BandLevels;
import org.roseate.spectrum.CalibrationException;
import org.roseate.spectrum.CrossSpectrumEstimator;
import org.roseate.spectrum.FilterBank;
import org.roseate.spectrum.WelchEstimator;

/**
 * The measurement pipeline: validates a request against a source, takes interleaved frames in blocks
 * of any size, and hands out immutable {@link MeasureResult}s. The command line (files and recorded
 * live captures), the window (files and live inputs) and {@code compare} all run this, so the same
 * samples and request give the same numbers everywhere.
 *
 * <p>Order of work per block: {@link SignalCheck} (refuses NaN or infinite samples at once, naming the
 * time), then the Welch estimator (both modes; in noise-source mode it also feeds the tone detector
 * and the calibration of filter-bank readings), then the filter bank when asked for.
 *
 * <p>Threading: one thread feeds and reads it; results are immutable and may be published to others.
 */
public final class MeasurePipeline {
    /** Frames per block the file runner reads. */
    public static final int BLOCK_FRAMES = 8192;

    private final MeasureRequest request;
    private final String source;
    private final double sampleRateHz;
    private final int channels;
    private final int segmentLength;
    private final SignalCheck check;
    private final WelchEstimator welch;
    private final CrossSpectrumEstimator cross;
    private final FilterBank bank;
    private final double[] bankNoiseBwHz;
    private final double[] scratch;
    private long frames;

    /**
     * @param request      what to measure
     * @param source       the file's path or the device's name, used in every message
     * @param sampleRateHz the capture's rate, Hz
     * @param channels     channels per interleaved frame
     * @param codeFs       one quantisation step in full-scale units (2^−(bits−1) for PCM), or 0 for float
     * @throws MeasureException naming the source: a channel the source lacks, a transfer on one
     *                          channel, bands above Nyquist, a calibration made at another rate, a
     *                          band table the filter bank cannot read at this rate
     */
    public MeasurePipeline(MeasureRequest request, String source, double sampleRateHz, int channels, double codeFs) {
        this.request = request;
        this.source = source;
        this.sampleRateHz = sampleRateHz;
        this.channels = channels;
        BandTable table = request.table();
        boolean transfer = request.mode() == MeasureMode.TRANSFER;
        if (transfer && channels < 2) {
            throw new MeasureException(source + ": a transfer measurement needs two channels (reference and response); "
                    + "the source has 1");
        }
        if (transfer) {
            checkChannel(request.referenceChannel(), "reference channel");
            checkChannel(request.responseChannel(), "response channel");
        } else {
            checkChannel(request.responseChannel(), "channel");
        }
        if (sampleRateHz / 2 <= table.band(0).lowHz()) {
            throw new MeasureException(source + ": every band lies above the Nyquist frequency " + sampleRateHz / 2 + " Hz");
        }
        if (request.calibration() != null) {
            try {
                request.calibration().checkRate(sampleRateHz);
            } catch (CalibrationException e) {
                throw new MeasureException(e.getMessage());
            }
        }
        if (request.segmentLength() > 0) {
            segmentLength = request.segmentLength();
        } else {
            try {
                segmentLength = BandLevels.autoSegmentLength(sampleRateHz, table);
            } catch (IllegalArgumentException e) {
                throw new MeasureException(source + ": " + e.getMessage());
            }
        }
        int[] checked = transfer ? new int[] {request.referenceChannel(), request.responseChannel()}
                : new int[] {request.responseChannel()};
        check = new SignalCheck(checked, sampleRateHz, codeFs);
        if (transfer) {
            cross = new CrossSpectrumEstimator();
            cross.prepare(sampleRateHz, request.welch(segmentLength));
            welch = null;
        } else {
            welch = new WelchEstimator();
            welch.prepare(sampleRateHz, request.welch(segmentLength));
            cross = null;
        }
        if (request.reader() == BandReader.FILTER_BANK) {
            bank = new FilterBank();
            try {
                bank.prepare(sampleRateHz, table);
            } catch (IllegalArgumentException e) {
                throw new MeasureException(source + ": the filter bank cannot read these bands at "
                        + hz(sampleRateHz) + " Hz: " + e.getMessage());
            }
            bankNoiseBwHz = new double[table.size()];
            for (int i = 0; i < bankNoiseBwHz.length; i++) {
                bankNoiseBwHz[i] = bank.filters().get(i).noiseBandwidthHz();
            }
            scratch = new double[BLOCK_FRAMES];
        } else {
            bank = null;
            bankNoiseBwHz = null;
            scratch = null;
        }
    }

    private void checkChannel(int channel, String what) {
        if (channel >= channels) {
            throw new MeasureException(source + ": " + what + " " + (channel + 1) + " is out of range; the source has "
                    + channels + (channels == 1 ? " channel" : " channels"));
        }
    }

    private static String hz(double v) {
        return v == Math.rint(v) ? Long.toString((long) v) : Double.toString(v);
    }

    /** The FFT length in use. */
    public int segmentLength() {
        return segmentLength;
    }

    /** The request. */
    public MeasureRequest request() {
        return request;
    }

    /**
     * Refuses a capture shorter than one analysis segment, saying which band needs how long.
     *
     * @param totalFrames the capture's length in frames
     * @throws MeasureException "FILE: the capture is 0.02 s (1000 frames), shorter than one analysis
     *                          segment of 131072 frames (2.73 s) that the 20 Hz band needs; …"
     */
    public void checkLength(long totalFrames) {
        if (totalFrames < segmentLength) {
            throw new MeasureException(String.format(Locale.ROOT, "%s: the capture is %.2f s (%d frames), shorter than "
                    + "one analysis segment of %d frames (%.2f s)%s; record longer, raise the low end of the range, or "
                    + "set a shorter segment", source, totalFrames / sampleRateHz, totalFrames, segmentLength,
                    segmentLength / sampleRateHz, request.segmentLength() == 0
                            ? " that the " + request.table().band(0).label() + " Hz band needs" : ""));
        }
    }

    /**
     * Takes frames: checks them, then feeds the estimators. Allocates nothing.
     *
     * @throws MeasureException at the first NaN or infinite sample of an analysed channel
     */
    public void accept(double[] interleaved, int frameCount) {
        check.accept(interleaved, frameCount, channels, source);
        if (welch != null) {
            welch.acceptInterleaved(interleaved, frameCount, channels, request.responseChannel());
        } else {
            cross.acceptInterleaved(interleaved, frameCount, channels, request.referenceChannel(), request.responseChannel());
        }
        if (bank != null) {
            int ch = request.responseChannel();
            for (int done = 0; done < frameCount; ) {
                int c = Math.min(scratch.length, frameCount - done);
                for (int i = 0; i < c; i++) {
                    scratch[i] = interleaved[(done + i) * channels + ch];
                }
                bank.accept(scratch, 0, c);
                done += c;
            }
        }
        frames += frameCount;
    }

    /**
     * Transforms the Welch segments on several threads (for file jobs; results are bitwise the same,
     * see {@link WelchEstimator#transformInParallel}). Leave off for live capture.
     */
    public void transformInParallel(boolean on) {
        if (welch != null) {
            welch.transformInParallel(on);
        } else {
            cross.transformInParallel(on);
        }
    }

    /** Segments averaged so far. */
    public long averages() {
        return welch != null ? welch.averages() : cross.averages();
    }

    /** Frames taken so far. */
    public long frames() {
        return frames;
    }

    /**
     * The result so far.
     *
     * @param complete true for the final result: then a silent capture is refused
     * @return null before the first complete segment, or (when not complete) while the input is silent
     * @throws MeasureException when complete and an analysed channel carries no signal
     *                          ("FILE: no signal: channel 1 is all zero"), or for bands the data cannot
     *                          resolve
     */
    public MeasureResult result(boolean complete) {
        if (averages() == 0) {
            return null;
        }
        ChannelIntegrity[] integrity = check.snapshot();
        for (ChannelIntegrity c : integrity) {
            if (c.noSignal()) {
                if (!complete) {
                    return null;
                }
                throw new MeasureException(source + ": no signal: channel " + (c.channel() + 1)
                        + (c.peakFs() == 0 ? " is all zero" : String.format(Locale.ROOT, " is at %.1f dBFS RMS, below %.0f dBFS",
                                c.rmsDbfs(), SignalCheck.NO_SIGNAL_DBFS)));
            }
        }
        MeasureAnalysis.Context ctx = new MeasureAnalysis.Context(source, request, sampleRateHz, frames / sampleRateHz,
                complete, List.of(integrity));
        try {
            if (welch != null) {
                return bank == null ? MeasureAnalysis.noise(ctx, welch.snapshot(), null, null, 0)
                        : MeasureAnalysis.noise(ctx, welch.snapshot(), bankMeanSquares(), bankNoiseBwHz,
                                bank.samples() / sampleRateHz);
            }
            return MeasureAnalysis.transfer(ctx, cross.snapshot());
        } catch (IllegalArgumentException e) {
            throw new MeasureException(source + ": " + e.getMessage());
        }
    }

    private double[] bankMeanSquares() {
        double[] ms = new double[request.table().size()];
        for (int i = 0; i < ms.length; i++) {
            ms[i] = bank.meanSquare(i);
        }
        return ms;
    }
}
