package org.roseate.app;

import org.roseate.spectrum.NoiseSourceResult;
import org.roseate.spectrum.TransferEstimate;
import org.roseate.spectrum.TransferResult;

/**
 * One published state of a measurement: a noise-source or a transfer result (the other is
 * null), how far it got and whether it is final. Immutable.
 *
 * @param source      the WAV file's or device's name
 * @param noise       the noise-source result, or null
 * @param transfer    the transfer result, or null
 * @param rawTransfer the transfer estimate before calibration (for saving a calibration), or null
 * @param seconds     seconds of audio analysed
 * @param complete    true for the final result of a file, false while it runs
 */
record MeasureOutcome(String source, NoiseSourceResult noise, TransferResult transfer, TransferEstimate rawTransfer,
        double seconds, boolean complete) {

    long averages() {
        return noise != null ? noise.density().averages() : transfer.estimate().averages();
    }
}
