package org.roseate.measure;

import org.roseate.bands.Band;

/**
 * One band of a measurement.
 *
 * @param band                   the IEC 61260-1 band
 * @param levelDb                noise source: dBFS (full-scale sine 0 dBFS) or dBV; transfer: the band's
 *                               mean power gain 10·log10(∫|H|² df / B), dB re 1
 * @param uncertaintyDb          one standard deviation of levelDb from random error, dB; NaN for a
 *                               tone-dominated band (the noise formula does not apply)
 * @param bins                   the band's width in FFT bins
 * @param complete               false when part of the band lies above the Nyquist frequency
 * @param toneDominated          the band's power is mostly one spectral line ({@link ToneDetector})
 * @param coherence              transfer: mean γ² over the band; NaN in noise-source mode
 * @param trusted                transfer: coherence ≥ the threshold; true in noise-source mode
 * @param belowCalibrationCorner the band starts below the calibration's −1 dB low corner
 * @param counted                the band enters the slope, the centring and the peak: complete,
 *                               trusted, not tone-dominated, with a finite level
 * @param normalizedDb           level minus the reference band's level, dB
 * @param deviationDb            level minus the target's band level, centred (NaN without a target)
 * @param designDifferenceDb     level minus the design's band level, centred (NaN without a design)
 */
public record BandResult(Band band, double levelDb, double uncertaintyDb, double bins, boolean complete,
        boolean toneDominated, double coherence, boolean trusted, boolean belowCalibrationCorner, boolean counted,
        double normalizedDb, double deviationDb, double designDifferenceDb) {
}
