package org.roseate.compare;

/**
 * A frequency range [loHz, hiHz] for comparisons, 0 &lt; loHz &lt; hiHz, both finite.
 * The default is the audio band 20 Hz–20 kHz.
 */
public record FrequencyRange(double loHz, double hiHz) {
    public static final FrequencyRange AUDIO = new FrequencyRange(20, 20000);

    public FrequencyRange {
        if (!(loHz > 0) || !Double.isFinite(hiHz) || !(hiHz > loHz)) {
            throw new IllegalArgumentException("range " + loHz + "-" + hiHz + " Hz must satisfy 0 < low < high");
        }
    }

    /** Octaves spanned: log2(hi/lo). */
    public double octaves() {
        return Math.log(hiHz / loHz) / Math.log(2);
    }

    /** Parses "20-20000", "20-20k", "0.1-50" (Hz). */
    public static FrequencyRange parse(String text) {
        String t = text.trim();
        int dash = t.indexOf('-', 1);
        if (dash < 0) {
            throw new IllegalArgumentException("expected a range such as 20-20000 (Hz), found '" + text + "'");
        }
        double lo = hz(t.substring(0, dash), text);
        double hi = hz(t.substring(dash + 1), text);
        try {
            return new FrequencyRange(lo, hi);
        } catch (IllegalArgumentException e) {
            throw new IllegalArgumentException("range '" + text + "' must have 0 < low < high");
        }
    }

    /** A frequency in Hz, allowing a k suffix: "20k" = 20000. */
    public static double hz(String s, String context) {
        String t = s.trim().toLowerCase(java.util.Locale.ROOT).replace("hz", "").trim();
        double mult = 1;
        if (t.endsWith("k")) {
            mult = 1000;
            t = t.substring(0, t.length() - 1);
        }
        try {
            double v = Double.parseDouble(t) * mult;
            if (!(v > 0) || !Double.isFinite(v)) {
                throw new NumberFormatException();
            }
            return v;
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException("expected a frequency in Hz such as 1000 or 20k, found '" + s.trim() + "' in '" + context + "'");
        }
    }
}
