package org.roseate.tools;

import java.util.List;
import org.roseate.compare.BandComparison;
import org.roseate.compare.BandReading;

/**
 * One column of a side-by-side comparison: a design's model today, a measured capture later.
 * Implementations are immutable.
 */
public interface ComparedColumn {
    /** A short name for the column header. */
    String name();

    /** Band levels and their centred deviations from the target, in band order. */
    BandComparison bands();

    /** Least-squares slope, dB/octave, or NaN when the source has none. */
    double slopeDbPerOctave();

    /** Pointwise centred peak deviation, dB, or NaN when the source has no continuous response. */
    double maxDeviationDb();

    /** Band levels minus the level of the band nearest 1 kHz, dB (the comparison's normalisation). */
    default double[] normalisedLevelsDb() {
        List<BandReading> r = bands().readings();
        int ref = 0;
        for (int i = 1; i < r.size(); i++) {
            if (Math.abs(Math.log(r.get(i).band().midHz() / 1000)) < Math.abs(Math.log(r.get(ref).band().midHz() / 1000))) {
                ref = i;
            }
        }
        double[] out = new double[r.size()];
        for (int i = 0; i < out.length; i++) {
            out[i] = r.get(i).levelDb() - r.get(ref).levelDb();
        }
        return out;
    }

    /** Centred band peak deviation, dB. */
    default double maxBandDeviationDb() {
        return bands().maxBandDeviationDb();
    }

    /** Ripple: largest minus smallest band deviation, dB (twice the band peak). */
    default double rippleDb() {
        double max = Double.NEGATIVE_INFINITY;
        double min = Double.POSITIVE_INFINITY;
        for (BandReading b : bands().readings()) {
            max = Math.max(max, b.deviationDb());
            min = Math.min(min, b.deviationDb());
        }
        return max - min;
    }
}
