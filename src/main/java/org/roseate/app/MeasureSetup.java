package org.roseate.app;

import org.roseate.measure.BandReader;
import org.roseate.measure.MeasureMode;
import org.roseate.measure.MeasureRequest;
import org.roseate.model.CircuitModel;
import org.roseate.spectrum.Calibration;
import org.roseate.spectrum.WelchSettings;

/**
 * What the measure view's controls say, turned into the core's {@link MeasureRequest}. Immutable.
 *
 * @param responseChannel  the measured channel (noise mode) or the response channel (transfer), zero-based
 * @param referenceChannel the reference channel in transfer mode, zero-based
 * @param design           the design's model, or null
 * @param calibration      a loopback calibration (both modes), or null
 * @param reader           Welch or the filter bank (noise-source mode)
 */
record MeasureSetup(MeasureMode mode, WelchSettings.Averaging averaging, AnalysisSettings analysis, int responseChannel,
        int referenceChannel, CircuitModel design, Calibration calibration, BandReader reader) {

    /** The core request: the window's range, bands and target, as the command line would make them. */
    MeasureRequest request() {
        MeasureRequest q = mode == MeasureMode.TRANSFER
                ? MeasureRequest.transfer(analysis.table(), analysis.range(), analysis.target(), referenceChannel, responseChannel)
                : MeasureRequest.noiseSource(analysis.table(), analysis.range(), analysis.target())
                        .withResponseChannel(responseChannel).withReader(reader);
        return q.withDesign(design).withCalibration(calibration).withAveraging(averaging);
    }
}
