package org.roseate.bands;

import java.util.Locale;
import java.util.Optional;

/** The bandwidth designator 1/b of a fractional-octave band (IEC 61260-1:2014, 3.3). */
public enum BandFraction {
    /** Octave bands, b = 1. */
    OCTAVE(1, "octave"),
    /** One-third-octave bands, b = 3. */
    THIRD_OCTAVE(3, "third-octave");

    private final int b;
    private final String displayName;

    BandFraction(int b, String displayName) {
        this.b = b;
        this.displayName = displayName;
    }

    /** The denominator b of the bandwidth designator: 1 for octave, 3 for one-third octave. */
    public int b() {
        return b;
    }

    /** "octave" or "third-octave", for messages. */
    public String displayName() {
        return displayName;
    }

    /**
     * Reads "octave" (also "1/1") or "third" (also "third-octave", "1/3"), ignoring case and
     * surrounding spaces; empty for anything else.
     */
    public static Optional<BandFraction> parse(String text) {
        if (text == null) {
            return Optional.empty();
        }
        return switch (text.trim().toLowerCase(Locale.ROOT)) {
            case "octave", "1/1" -> Optional.of(OCTAVE);
            case "third", "third-octave", "1/3" -> Optional.of(THIRD_OCTAVE);
            default -> Optional.empty();
        };
    }
}
