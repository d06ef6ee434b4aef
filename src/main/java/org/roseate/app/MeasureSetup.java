package org.roseate.app;

import org.roseate.model.CircuitModel;
import org.roseate.spectrum.Calibration;
import org.roseate.spectrum.WelchSettings;

/**
 * How a measurement is made: mode, averaging, channels (zero-based), the comparison settings, an
 * optional calibration (transfer mode) and the design to compare with. Immutable.
 *
 * @param responseChannel  the measured channel (noise mode) or the response channel (transfer)
 * @param referenceChannel the reference channel in transfer mode
 * @param design           the design's model, or null
 * @param calibration      divides the chain's own response out of a transfer, or null
 */
record MeasureSetup(Mode mode, WelchSettings.Averaging averaging, AnalysisSettings analysis, int responseChannel,
        int referenceChannel, CircuitModel design, Calibration calibration) {
    /** What is measured. */
    enum Mode {
        /** Band levels of a noise source, one channel. */
        NOISE_SOURCE("Noise source"),
        /** H1 transfer function and coherence from a reference and a response channel. */
        TRANSFER("Transfer (H1, two channels)");

        private final String label;

        Mode(String label) {
            this.label = label;
        }

        @Override
        public String toString() {
            return label;
        }
    }

    /** Time constant of exponential averaging, segments (common practice for analyzers: a few seconds). */
    static final int EXPONENTIAL_SEGMENTS = 8;

    MeasureSetup {
        if (responseChannel < 0 || referenceChannel < 0) {
            throw new IllegalArgumentException("channels " + referenceChannel + ", " + responseChannel + " must be >= 0");
        }
    }

    /** The Welch settings for a segment length: Hann, 50 % overlap, linear or exponential. */
    WelchSettings welch(int segmentLength) {
        WelchSettings w = WelchSettings.of(segmentLength);
        return averaging == WelchSettings.Averaging.EXPONENTIAL ? w.exponential(EXPONENTIAL_SEGMENTS) : w;
    }
}
