package org.roseate.measure;

/**
 * The measured response at one frequency: in transfer mode |H| and its phase; in noise-source mode
 * (when asked for) the power density in dB per hertz, with NaN phase and coherence.
 *
 * @param hz             frequency, Hz
 * @param db             20·log10|H|, dB re 1
 * @param deg            arg H, degrees
 * @param coherence      γ²
 * @param trusted        γ² ≥ the threshold
 * @param uncertaintyDb  one standard deviation of db: 20·log10(1 + ε) with ε the normalized random
 *                       error of |H| (see {@link MeasureAnalysis#magnitudeRandomError})
 * @param uncertaintyDeg one standard deviation of the phase, ε radians in degrees (same source)
 * @param targetDb       the target line through the measured level at the point nearest 1 kHz;
 *                       NaN without a target
 * @param modelDb        the design's 20·log10|H|; NaN without a design
 */
public record ResponsePoint(double hz, double db, double deg, double coherence, boolean trusted,
        double uncertaintyDb, double uncertaintyDeg, double targetDb, double modelDb) {
}
