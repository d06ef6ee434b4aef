package org.roseate.app;

import org.roseate.bands.BandFraction;
import org.roseate.bands.BandTable;
import org.roseate.compare.FrequencyRange;
import org.roseate.compare.TargetSlope;

/**
 * What every view compares against: the frequency range, the target slope and the band width.
 * Immutable; the window holds the current one.
 */
record AnalysisSettings(FrequencyRange range, TargetSlope target, BandFraction fraction) {
    static final AnalysisSettings DEFAULT = new AnalysisSettings(FrequencyRange.AUDIO, TargetSlope.PINK,
            BandFraction.THIRD_OCTAVE);

    /** The IEC 61260-1 bands whose nominal frequency lies in the range. */
    BandTable table() {
        return BandTable.of(fraction, range.loHz(), range.hiHz());
    }

    AnalysisSettings withTarget(TargetSlope t) {
        return new AnalysisSettings(range, t, fraction);
    }

    AnalysisSettings withRange(FrequencyRange r) {
        return new AnalysisSettings(r, target, fraction);
    }

    AnalysisSettings withFraction(BandFraction f) {
        return new AnalysisSettings(range, target, f);
    }
}
