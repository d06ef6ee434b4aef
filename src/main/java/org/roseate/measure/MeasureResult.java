package org.roseate.measure;

import java.util.List;
import org.roseate.bands.Band;
import org.roseate.spectrum.TransferEstimate;

/**
 * What a measurement found: immutable, the same for every face that shows it.
 *
 * @param source                      the WAV file's or device's name
 * @param request                     the request it answers
 * @param sampleRateHz                the capture's rate, Hz
 * @param secondsAnalysed             seconds of audio read
 * @param complete                    true for the final result, false while a measurement runs
 * @param integrity                   per analysed channel (the measured one; in transfer mode
 *                                    reference first, then response)
 * @param segmentLength               FFT length n
 * @param resolutionHz                fs/n, Hz
 * @param averages                    segments averaged
 * @param effectiveSeconds            T_eff of the band-power error ε = 1/√(B·T_eff), s (Welch); for
 *                                    the filter bank, the averaged duration
 * @param levelUnit                   "dBFS", "dBV" or "dB re 1" (transfer: gain)
 * @param bands                       the band table's readings, in frequency order
 * @param referenceBand               the band levels are normalised to: the 1 kHz band or the nearest
 * @param slopeDbPerOctave            least-squares slope of the density the counted bands imply (band
 *                                    level minus 10·log10 of its width; transfer: the gain) against
 *                                    log2 f, dB/octave, with its ± from the band uncertainties
 * @param maxBandDeviationDb          the largest centred deviation from the target over the counted
 *                                    bands, dB, with its ±; {@link Estimate#NONE} without a target
 * @param designOffsetDb              the weighted mean of level minus design level over the counted
 *                                    bands, dB (NaN without a design)
 * @param points                      transfer mode: the response points (|H|, phase, coherence); noise-source
 *                                    mode: only when the request names frequencies, the power density
 *                                    (level unit per hertz) pooled over bins centred on the bin nearest
 *                                    each point (whose frequency the point takes), with its ± and no
 *                                    phase; empty otherwise
 * @param calibrationCornerHz         the calibration's −1 dB low corner, Hz, or NaN
 * @param rawTransfer                 transfer mode: the estimate before calibration (to save a
 *                                    calibration from a loopback), or null
 */
public record MeasureResult(String source, MeasureRequest request, double sampleRateHz, double secondsAnalysed,
        boolean complete, List<ChannelIntegrity> integrity, int segmentLength, double resolutionHz, long averages,
        double effectiveSeconds, String levelUnit, List<BandResult> bands, Band referenceBand,
        Estimate slopeDbPerOctave, Estimate maxBandDeviationDb, double designOffsetDb, List<ResponsePoint> points,
        double calibrationCornerHz, TransferEstimate rawTransfer) {
    public MeasureResult {
        integrity = List.copyOf(integrity);
        bands = List.copyOf(bands);
        points = List.copyOf(points);
    }

    /** The mode measured. */
    public MeasureMode mode() {
        return request.mode();
    }

    /** Clipped samples over the analysed channels. */
    public long clippedSamples() {
        long n = 0;
        for (ChannelIntegrity c : integrity) {
            n += c.clippedSamples();
        }
        return n;
    }

    /** The measured (noise) or response (transfer) channel's integrity. */
    public ChannelIntegrity measuredChannel() {
        return integrity.get(integrity.size() - 1);
    }

    /** True when compared with a design. */
    public boolean hasDesign() {
        return request.design() != null;
    }

    /** True when compared with a target. */
    public boolean hasTarget() {
        return request.target() != null;
    }

    /** Bands that enter the slope and the peak. */
    public long countedBands() {
        return bands.stream().filter(BandResult::counted).count();
    }

    /**
     * Warnings a user must see (clipping, bands below the calibration corner, untrusted or tonal
     * bands), one line each, without the "roseate: " prefix; empty when there is nothing to say.
     */
    public List<String> warnings() {
        java.util.ArrayList<String> w = new java.util.ArrayList<>();
        for (ChannelIntegrity c : integrity) {
            if (c.clipped()) {
                w.add(String.format(java.util.Locale.ROOT, "warning: %s: channel %d has %d clipped or flat-topped samples "
                        + "(%.3g %% of %d); the readings include the distortion", source, c.channel() + 1, c.clippedSamples(),
                        100.0 * c.clippedSamples() / Math.max(1, c.frames()), c.frames()));
            }
        }
        long tones = bands.stream().filter(BandResult::toneDominated).count();
        if (tones > 0) {
            w.add("warning: " + source + ": " + tones + (tones == 1 ? " band is" : " bands are")
                    + " dominated by a tone (marked ~); they carry no noise ± and are left out of the slope and peak");
        }
        long untrusted = bands.stream().filter(b -> !b.trusted()).count();
        if (untrusted > 0) {
            w.add("warning: " + source + ": " + untrusted + (untrusted == 1 ? " band has" : " bands have")
                    + " coherence below " + request.coherenceThreshold() + " (marked *); shown, but left out of the slope and peak");
        }
        long below = bands.stream().filter(BandResult::belowCalibrationCorner).count();
        if (below > 0) {
            w.add(String.format(java.util.Locale.ROOT, "warning: %s: %d %s below the calibration's -1 dB corner at %.3g Hz "
                    + "(marked <); the correction there is large", source, below, below == 1 ? "band starts" : "bands start",
                    calibrationCornerHz));
        }
        return List.copyOf(w);
    }

    /** The legend printed under every form of output: what the numbers are and where their ± come from. */
    public String legend() {
        return mode() == MeasureMode.NOISE_SOURCE ? MeasureAnalysis.NOISE_LEGEND
                + (request.reader() == BandReader.FILTER_BANK ? " " + MeasureAnalysis.BANK_LEGEND : "")
                : MeasureAnalysis.TRANSFER_LEGEND;
    }
}
