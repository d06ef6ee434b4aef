package org.roseate.tools;

/**
 * A gain the fitter must keep: |H(j·2π·atHz)| expressed in dB, 20·log10|H|.
 *
 * @param gainDb the gain to hold, dB, finite (−200 … 200)
 * @param atHz   where it is held, Hz, finite, &gt; 0
 */
public record GainHold(double gainDb, double atHz) {
    public GainHold {
        if (!Double.isFinite(gainDb) || Math.abs(gainDb) > 200) {
            throw new IllegalArgumentException("gainDb=" + gainDb + " must be finite, -200 to 200");
        }
        if (!(atHz > 0) || !Double.isFinite(atHz)) {
            throw new IllegalArgumentException("atHz=" + atHz + " must be finite and > 0");
        }
    }

    /**
     * Reads "G@F": a gain in dB (an optional "dB" suffix) and a frequency in Hz (an optional "Hz"
     * suffix, SI prefix k allowed), e.g. "40@1k", "-3.5dB@100Hz", "0@1000".
     *
     * @throws IllegalArgumentException quoting the text when it does not read
     */
    public static GainHold parse(String text) {
        String t = text.trim();
        int at = t.indexOf('@');
        if (at <= 0 || at == t.length() - 1) {
            throw new IllegalArgumentException("expected a gain and a frequency such as 40@1k (40 dB at 1 kHz), found '" + text + "'");
        }
        String g = t.substring(0, at).trim();
        if (g.toLowerCase(java.util.Locale.ROOT).endsWith("db")) {
            g = g.substring(0, g.length() - 2).trim();
        }
        String f = t.substring(at + 1).trim();
        if (f.toLowerCase(java.util.Locale.ROOT).endsWith("hz")) {
            f = f.substring(0, f.length() - 2).trim();
        }
        double gain;
        try {
            gain = Double.parseDouble(g);
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException("expected a gain in dB before '@', such as 40@1k, found '" + text + "'");
        }
        double hz = org.roseate.compare.FrequencyRange.hz(f, text);
        try {
            return new GainHold(gain, hz);
        } catch (IllegalArgumentException e) {
            throw new IllegalArgumentException("'" + text + "': the gain must be finite within ±200 dB and the frequency > 0");
        }
    }
}
