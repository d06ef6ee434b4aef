package org.roseate.cli;

import org.roseate.sweep.SweepSpec;
import picocli.CommandLine.Option;

/**
 * The swept-sine options, a picocli mixin meant for {@code measure} ({@code @Mixin SweepOptions sweep;}):
 * whether to use a sweep, and its parameters. For a capture made elsewhere they must be the
 * parameters the sweep was played with.
 */
public final class SweepOptions {
    @Option(names = "--sweep", description = "measure with an exponential swept sine (Farina's method) instead of noise")
    boolean sweep;

    @Option(names = "--sweep-from", paramLabel = "HZ", defaultValue = "20", description = "sweep start frequency (default: ${DEFAULT-VALUE} Hz)")
    double fromHz;

    @Option(names = "--sweep-to", paramLabel = "HZ", defaultValue = "20000", description = "sweep end frequency (default: ${DEFAULT-VALUE} Hz)")
    double toHz;

    @Option(names = "--sweep-seconds", paramLabel = "S", defaultValue = "5", description = "sweep duration (default: ${DEFAULT-VALUE} s)")
    double seconds;

    @Option(names = "--sweep-fade-ms", paramLabel = "MS", defaultValue = "50", description = "half-Hann fade at each end (default: ${DEFAULT-VALUE} ms)")
    double fadeMs;

    @Option(names = "--points-per-octave", paramLabel = "N", defaultValue = "12", description = "with --sweep: result points per octave, 1 to 96 (default: ${DEFAULT-VALUE})")
    int pointsPerOctave;

    /** Whether --sweep was given. */
    public boolean enabled() {
        return sweep;
    }

    /** The sweep at a sample rate; bad parameters are a {@link UserInputException} naming the option. */
    public SweepSpec spec(double sampleRateHz) {
        if (pointsPerOctave < 1 || pointsPerOctave > 96) {
            throw new UserInputException("--points-per-octave: expected 1 to 96, found " + pointsPerOctave);
        }
        try {
            return new SweepSpec(fromHz, toHz, seconds, fadeMs / 1000, sampleRateHz);
        } catch (IllegalArgumentException e) {
            throw new UserInputException("--sweep-from/--sweep-to/--sweep-seconds/--sweep-fade-ms: " + e.getMessage());
        }
    }

    public int pointsPerOctave() {
        return pointsPerOctave;
    }
}
