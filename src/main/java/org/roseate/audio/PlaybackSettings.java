package org.roseate.audio;

/**
 * How the playback engine starts, switches and stops. Immutable.
 *
 * @param safetyRampSeconds   rise from silence to the set level at start, ≥ 0 (default 1 s): the
 *                            gain climbs linearly in dB from {@link PlaybackEngine#RAMP_FLOOR_DB}
 *                            to 0 dB, so a level set too high is heard growing, not as a blast
 * @param fadeSeconds         linear fade at start (from exact silence) and at stop, ≥ 0 (default 20 ms)
 * @param crossfadeSeconds    equal-power crossfade when the source is replaced, ≥ 0 (default 30 ms;
 *                            0 switches hard, for tests)
 * @param stallTimeoutSeconds no device progress for this long is a stall, &gt; 0 (default 2 s)
 * @param ditherSeed          seed of the TPDF dither generator
 */
public record PlaybackSettings(double safetyRampSeconds, double fadeSeconds, double crossfadeSeconds,
        double stallTimeoutSeconds, long ditherSeed) {
    /** Validates the ranges. */
    public PlaybackSettings {
        check("safetyRampSeconds", safetyRampSeconds, 0, 60);
        check("fadeSeconds", fadeSeconds, 0, 10);
        check("crossfadeSeconds", crossfadeSeconds, 0, 10);
        check("stallTimeoutSeconds", stallTimeoutSeconds, 1e-3, 3600);
    }

    /** 1 s safety ramp, 20 ms fades, 30 ms crossfade, 2 s stall timeout, dither seed 1. */
    public static PlaybackSettings defaults() {
        return new PlaybackSettings(1.0, 0.020, 0.030, 2.0, 1L);
    }

    /** A copy with another stall timeout. */
    public PlaybackSettings withStallTimeoutSeconds(double seconds) {
        return new PlaybackSettings(safetyRampSeconds, fadeSeconds, crossfadeSeconds, seconds, ditherSeed);
    }

    /** A copy with another crossfade. */
    public PlaybackSettings withCrossfadeSeconds(double seconds) {
        return new PlaybackSettings(safetyRampSeconds, fadeSeconds, seconds, stallTimeoutSeconds, ditherSeed);
    }

    private static void check(String name, double v, double lo, double hi) {
        if (!(v >= lo && v <= hi)) {
            throw new IllegalArgumentException(name + "=" + v + " must be in [" + lo + ", " + hi + "]");
        }
    }
}
