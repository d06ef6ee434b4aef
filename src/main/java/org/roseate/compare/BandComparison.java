package org.roseate.compare;

import java.util.ArrayList;
import java.util.List;
import org.roseate.bands.Band;
import org.roseate.bands.BandTable;

/**
 * Band levels against a target: each band's level minus the target's band level (the power of
 * the target density (f/1 kHz)^γ over the same band), centred so that the largest and smallest
 * deviation are equal and opposite. An ideal pink response reads flat here, since a 1/f density
 * has the same power in every band of equal frequency ratio.
 *
 * @param readings              per band, in frequency order
 * @param offsetDb              the centring offset applied to the deviations
 * @param maxBandDeviationDb    the peak centred deviation
 */
public record BandComparison(List<BandReading> readings, double offsetDb, double maxBandDeviationDb) {
    public BandComparison {
        readings = List.copyOf(readings);
    }

    /**
     * @param table    the bands
     * @param levelsDb the measured or modelled level of each band, dB (same order as the table)
     */
    public static BandComparison of(BandTable table, double[] levelsDb, TargetSlope target) {
        List<Band> bands = table.bands();
        if (levelsDb.length != bands.size()) {
            throw new IllegalArgumentException(levelsDb.length + " levels for " + bands.size() + " bands");
        }
        double[] raw = new double[bands.size()];
        for (int i = 0; i < raw.length; i++) {
            Band b = bands.get(i);
            raw[i] = levelsDb[i] - 10 * Math.log10(target.bandPower(b.lowHz(), b.highHz()));
        }
        Centering c = Centering.of(raw);
        double[] dev = c.apply(raw);
        List<BandReading> out = new ArrayList<>();
        for (int i = 0; i < raw.length; i++) {
            out.add(new BandReading(bands.get(i), levelsDb[i], dev[i]));
        }
        return new BandComparison(out, c.offsetDb(), c.peakDb());
    }
}
