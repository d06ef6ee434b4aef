package org.roseate.measure;

import java.util.Objects;
import org.roseate.bands.BandTable;
import org.roseate.compare.FrequencyRange;
import org.roseate.compare.TargetSlope;
import org.roseate.model.CircuitModel;
import org.roseate.spectrum.Calibration;
import org.roseate.spectrum.WelchSettings;

/**
 * Everything a measurement needs besides the samples. Immutable; build one with
 * {@link #noiseSource} or {@link #transfer} and the {@code with…} methods.
 *
 * @param mode                noise source (one channel) or transfer (two)
 * @param reader              Welch or the filter bank; the filter bank reads noise-source levels only
 * @param table               the bands
 * @param range               the frequency range asked for (the response grid spans it), Hz
 * @param target              the slope the bands are compared with, or null for none
 * @param design              the design the capture is compared with (its predicted band shape), or null
 * @param calibration         a loopback calibration divided out of the readings (both modes), or null
 * @param voltsPerFullScale   volts peak at input full scale (levels in dBV), or NaN: then the
 *                            calibration's value if it has one, else dBFS
 * @param segmentLength       FFT length, an even number from 16 to {@link WelchSettings#MAX_SEGMENT_LENGTH},
 *                            or 0 for automatic ({@link org.roseate.spectrum.BandLevels#autoSegmentLength})
 * @param averaging           linear (plain mean) or exponential
 * @param exponentialSegments the time constant of exponential averaging, segments (≥ 1; unused for linear)
 * @param responseChannel     zero-based: the measured channel (noise source) or the response channel
 * @param referenceChannel    zero-based reference channel in transfer mode; −1 in noise-source mode
 * @param responseHz          transfer mode: response points, Hz; null for a log grid, 20 per decade,
 *                            over the range. Noise-source mode: density points, each pooled over bins
 *                            centred on the bin nearest to it (see {@link MeasureResult#points}); null for none
 * @param coherenceThreshold  transfer mode: a band or point is trusted when its γ² reaches this, (0, 1]
 */
public record MeasureRequest(MeasureMode mode, BandReader reader, BandTable table, FrequencyRange range,
        TargetSlope target, CircuitModel design, Calibration calibration, double voltsPerFullScale,
        int segmentLength, WelchSettings.Averaging averaging, int exponentialSegments, int responseChannel,
        int referenceChannel, double[] responseHz, double coherenceThreshold) {
    /**
     * γ² from which a band or point is trusted: 0.9 (common practice). Then at least 90 % of the
     * response power is linearly related to the reference, and the random error of |H| with n_d
     * averages is at most 0.24/√n_d (Bendat and Piersol, Random Data, 4th ed., sec. 9.2, from memory).
     */
    public static final double DEFAULT_COHERENCE_THRESHOLD = 0.9;
    /** Time constant of exponential averaging, segments (common practice for analyzers: a few seconds). */
    public static final int DEFAULT_EXPONENTIAL_SEGMENTS = 8;
    /** Response points per decade of the default grid. */
    public static final int RESPONSE_POINTS_PER_DECADE = 20;
    /** Shortest segment accepted, samples. */
    public static final int MIN_SEGMENT = 16;

    /**
     * @throws MeasureException with a one-line message for inconsistent settings
     */
    public MeasureRequest {
        Objects.requireNonNull(mode, "mode");
        Objects.requireNonNull(reader, "reader");
        Objects.requireNonNull(table, "table");
        Objects.requireNonNull(range, "range");
        Objects.requireNonNull(averaging, "averaging");
        responseHz = responseHz == null ? null : responseHz.clone();
        if (reader == BandReader.FILTER_BANK && mode == MeasureMode.TRANSFER) {
            throw new MeasureException("the filter bank reads noise-source band levels; a transfer measurement uses Welch");
        }
        if (responseChannel < 0) {
            throw new MeasureException("channel " + (responseChannel + 1) + " does not exist; channels count from 1");
        }
        if (mode == MeasureMode.TRANSFER) {
            if (referenceChannel < 0) {
                throw new MeasureException("reference channel " + (referenceChannel + 1) + " does not exist; channels count from 1");
            }
            if (referenceChannel == responseChannel) {
                throw new MeasureException("the reference and the response are both channel " + (responseChannel + 1)
                        + "; they must differ");
            }
        }
        if (segmentLength != 0 && (segmentLength < MIN_SEGMENT || segmentLength > WelchSettings.MAX_SEGMENT_LENGTH
                || segmentLength % 2 != 0)) {
            throw new MeasureException("segment length: expected an even number of samples from " + MIN_SEGMENT + " to "
                    + WelchSettings.MAX_SEGMENT_LENGTH + ", found " + segmentLength);
        }
        if (!Double.isNaN(voltsPerFullScale) && !(voltsPerFullScale > 0 && Double.isFinite(voltsPerFullScale))) {
            throw new MeasureException("volts per full scale: expected a positive number of volts, found " + voltsPerFullScale);
        }
        if (!(coherenceThreshold > 0 && coherenceThreshold <= 1)) {
            throw new MeasureException("coherence threshold: expected a value in (0, 1], found " + coherenceThreshold);
        }
        if (exponentialSegments < 1) {
            throw new MeasureException("exponential averaging: expected at least 1 segment, found " + exponentialSegments);
        }
        if (responseHz != null) {
            if (responseHz.length == 0) {
                throw new MeasureException("response points: name at least one frequency");
            }
            for (double f : responseHz) {
                if (!(f > 0) || !Double.isFinite(f)) {
                    throw new MeasureException("response points: " + f + " Hz is not a positive frequency");
                }
            }
        }
    }

    /** A noise-source request: Welch, channel 1, automatic segment, linear averaging, no design or calibration. */
    public static MeasureRequest noiseSource(BandTable table, FrequencyRange range, TargetSlope target) {
        return new MeasureRequest(MeasureMode.NOISE_SOURCE, BandReader.WELCH, table, range, target, null, null,
                Double.NaN, 0, WelchSettings.Averaging.LINEAR, DEFAULT_EXPONENTIAL_SEGMENTS, 0, -1, null,
                DEFAULT_COHERENCE_THRESHOLD);
    }

    /**
     * A transfer request from a zero-based reference to a zero-based response channel; compared with
     * a target only when one is given (null: none).
     */
    public static MeasureRequest transfer(BandTable table, FrequencyRange range, TargetSlope target,
            int referenceChannel, int responseChannel) {
        return new MeasureRequest(MeasureMode.TRANSFER, BandReader.WELCH, table, range, target, null, null,
                Double.NaN, 0, WelchSettings.Averaging.LINEAR, DEFAULT_EXPONENTIAL_SEGMENTS, responseChannel,
                referenceChannel, null, DEFAULT_COHERENCE_THRESHOLD);
    }

    @Override
    public double[] responseHz() {
        return responseHz == null ? null : responseHz.clone();
    }

    public MeasureRequest withReader(BandReader r) {
        return new MeasureRequest(mode, r, table, range, target, design, calibration, voltsPerFullScale, segmentLength,
                averaging, exponentialSegments, responseChannel, referenceChannel, responseHz, coherenceThreshold);
    }

    public MeasureRequest withDesign(CircuitModel d) {
        return new MeasureRequest(mode, reader, table, range, target, d, calibration, voltsPerFullScale, segmentLength,
                averaging, exponentialSegments, responseChannel, referenceChannel, responseHz, coherenceThreshold);
    }

    public MeasureRequest withCalibration(Calibration c) {
        return new MeasureRequest(mode, reader, table, range, target, design, c, voltsPerFullScale, segmentLength,
                averaging, exponentialSegments, responseChannel, referenceChannel, responseHz, coherenceThreshold);
    }

    /** @param volts volts peak at full scale, or NaN */
    public MeasureRequest withVoltsPerFullScale(double volts) {
        return new MeasureRequest(mode, reader, table, range, target, design, calibration, volts, segmentLength,
                averaging, exponentialSegments, responseChannel, referenceChannel, responseHz, coherenceThreshold);
    }

    /** @param n an even FFT length, or 0 for automatic */
    public MeasureRequest withSegmentLength(int n) {
        return new MeasureRequest(mode, reader, table, range, target, design, calibration, voltsPerFullScale, n,
                averaging, exponentialSegments, responseChannel, referenceChannel, responseHz, coherenceThreshold);
    }

    public MeasureRequest withAveraging(WelchSettings.Averaging a) {
        return new MeasureRequest(mode, reader, table, range, target, design, calibration, voltsPerFullScale, segmentLength,
                a, exponentialSegments, responseChannel, referenceChannel, responseHz, coherenceThreshold);
    }

    /** @param channel zero-based measured (noise) or response (transfer) channel */
    public MeasureRequest withResponseChannel(int channel) {
        return new MeasureRequest(mode, reader, table, range, target, design, calibration, voltsPerFullScale, segmentLength,
                averaging, exponentialSegments, channel, referenceChannel, responseHz, coherenceThreshold);
    }

    /** @param hz response points, Hz, or null for the log grid */
    public MeasureRequest withResponseHz(double[] hz) {
        return new MeasureRequest(mode, reader, table, range, target, design, calibration, voltsPerFullScale, segmentLength,
                averaging, exponentialSegments, responseChannel, referenceChannel, hz, coherenceThreshold);
    }

    /** The volts per full scale in effect: the request's, else the calibration's, else NaN. */
    public double effectiveVoltsPerFullScale() {
        if (!Double.isNaN(voltsPerFullScale)) {
            return voltsPerFullScale;
        }
        return calibration != null ? calibration.voltsPerFullScale() : Double.NaN;
    }

    /** The Welch settings for a segment length: Hann, 50 % overlap, linear or exponential. */
    public WelchSettings welch(int n) {
        WelchSettings w = WelchSettings.of(n);
        return averaging == WelchSettings.Averaging.EXPONENTIAL ? w.exponential(exponentialSegments) : w;
    }
}
