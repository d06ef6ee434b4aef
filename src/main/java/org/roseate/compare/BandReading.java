package org.roseate.compare;

import org.roseate.bands.Band;

/**
 * One band's level and its deviation from the target.
 *
 * @param band        the IEC 61260-1 band
 * @param levelDb     10·log10 of the band power (for a model: of unit-density white noise
 *                    through it, ∫|H|² df; for a capture: dBFS)
 * @param deviationDb level minus the target's band level, centred over the bands compared
 */
public record BandReading(Band band, double levelDb, double deviationDb) {
}
