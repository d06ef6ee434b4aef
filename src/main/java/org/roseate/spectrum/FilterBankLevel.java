package org.roseate.spectrum;

import org.roseate.bands.Band;

/**
 * One band's level read by the time-domain {@link FilterBank}.
 *
 * @param band       the IEC 61260-1 band
 * @param meanSquare mean square of the band filter's output over the averaged samples, FS² (≥ 0)
 * @param levelDbfs  10·log10(2·meanSquare): a full-scale sine (mean square 1/2) at midband reads 0 dBFS
 *                   (AES17 convention, as {@link BandLevels}); −∞ for exact silence
 * @param samples    number of samples averaged
 */
public record FilterBankLevel(Band band, double meanSquare, double levelDbfs, long samples) {
}
