package org.roseate.spectrum;

import org.roseate.bands.Band;

/**
 * One band's measured level.
 *
 * @param band            the IEC 61260-1 band
 * @param power           ∫ density df over the band (fractional edge bins), in the density's
 *                        unit times Hz (FS², V², or |H|²·Hz for a transfer function)
 * @param levelDb         the level: dBFS (10·log10(2·power)), dBV, or 10·log10(power) for a
 *                        transfer function (see the producer)
 * @param relativeError   ε, the normalized random error (one standard deviation) of power;
 *                        NaN where not estimated
 * @param uncertaintyDb   10·log10(1 + ε): the one-standard-deviation uncertainty of levelDb, dB;
 *                        NaN where not estimated
 * @param bins            the band width in bins, (covered width)/Δf
 * @param complete        false when part of the band lies above the Nyquist frequency, so the
 *                        level covers only the part below it
 */
public record BandLevel(Band band, double power, double levelDb, double relativeError, double uncertaintyDb,
        double bins, boolean complete) {
}
