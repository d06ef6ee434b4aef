package org.roseate.cli;

import org.roseate.bands.BandFraction;
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

    FrequencyRange range() {
        return Inputs.range(range);
    }

    TargetSlope target() {
        return Inputs.slope(slope);
    }

    BandFraction fraction() {
        return BandFraction.parse(bands)
                .orElseThrow(() -> new UserInputException("--bands: expected octave or third, found '" + bands + "'"));
    }
}
