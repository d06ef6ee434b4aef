package org.roseate.cli;

import org.roseate.bands.Band;
import org.roseate.bands.BandFraction;
import org.roseate.bands.BandTable;
import org.roseate.compare.FrequencyRange;
import org.roseate.compare.TargetSlope;
import picocli.CommandLine.Option;

/** The options every band-reading command shares: range, band width and target slope. */
final class BandOptions {
    @Option(names = "--range", defaultValue = "20-20000", paramLabel = "LO-HI", description = "frequency range in Hz (default: ${DEFAULT-VALUE})")
    String range;

    @Option(names = "--bands", defaultValue = "third", paramLabel = "octave|third", description = "band width (default: ${DEFAULT-VALUE})")
    String bands;

    @Option(names = "--slope", defaultValue = "pink", paramLabel = "DB_PER_OCTAVE",
            description = "target slope in dB/octave, or pink, white, brown, blue (default: ${DEFAULT-VALUE} = −3.0103)")
    String slope;

    /**
     * The range, refused when it reaches beyond the bands Roseate tabulates (IEC 61260-1 nominal
     * midbands {@link Band#MIN_NOMINAL_HZ} to {@link Band#MAX_NOMINAL_HZ} Hz): a range past them
     * would be cut silently.
     */
    FrequencyRange range() {
        return analysableRange(range);
    }

    /** {@link #range()} for a command that takes {@code --range} without the rest of this mixin. */
    static FrequencyRange analysableRange(String range) {
        FrequencyRange r = Inputs.range(range);
        double slack = 1 + BandTable.RELATIVE_SLACK;
        if (r.loHz() < Band.MIN_NOMINAL_HZ / slack || r.hiHz() > Band.MAX_NOMINAL_HZ * slack) {
            throw new UserInputException("--range: " + range + " reaches beyond the analysable range, "
                    + Numbers.hz(Band.MIN_NOMINAL_HZ) + " to " + Numbers.hz(Band.MAX_NOMINAL_HZ)
                    + " (the nominal midbands of the IEC 61260-1 bands Roseate tabulates)");
        }
        return r;
    }

    TargetSlope target() {
        return Inputs.slope(slope);
    }

    BandFraction fraction() {
        return fraction(bands);
    }

    /** {@link #fraction()} for a command that takes {@code --bands} without the rest of this mixin. */
    static BandFraction fraction(String bands) {
        return BandFraction.parse(bands)
                .orElseThrow(() -> new UserInputException("--bands: expected octave or third, found '" + bands + "'"));
    }
}
