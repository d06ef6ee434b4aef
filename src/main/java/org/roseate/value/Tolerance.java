package org.roseate.value;

import java.math.BigDecimal;
import java.math.MathContext;
import java.util.Objects;

/**
 * A symmetric component tolerance: the true value lies within nominal × (1 ± fraction).
 *
 * @param fraction the tolerance as a fraction of the nominal value, 0 &lt; fraction &lt; 1
 *                 (0.01 for 1 %)
 */
public record Tolerance(double fraction) {
    /** Significant digits kept by {@link #toString()}, enough to hide binary rounding. */
    private static final MathContext PRINT_DIGITS = new MathContext(10);

    /** @throws IllegalArgumentException unless 0 &lt; fraction &lt; 1 */
    public Tolerance {
        if (!(fraction > 0 && fraction < 1)) {
            throw new IllegalArgumentException("fraction=" + fraction + " must be > 0 and < 1");
        }
    }

    /**
     * Reads a tolerance written in percent: "1%", "0.5 %", "±5%", "10%", "0.1%". Surrounding
     * whitespace is ignored; a space may stand before the '%'; the sign '±' may lead.
     *
     * @throws ValueFormatException (offset at the offending character) if the text is not a
     *                              percentage, or is not &gt; 0 % and &lt; 100 %
     */
    public static Tolerance parse(String text) {
        Objects.requireNonNull(text, "text");
        int start = 0;
        int end = text.length();
        while (start < end && Character.isWhitespace(text.charAt(start))) {
            start++;
        }
        while (end > start && Character.isWhitespace(text.charAt(end - 1))) {
            end--;
        }
        String shown = text.substring(start, end);
        int pos = start;
        if (pos < end && text.charAt(pos) == '±') {
            pos++;
        }
        int numberStart = pos;
        boolean anyDigit = false;
        boolean dot = false;
        while (pos < end) {
            char c = text.charAt(pos);
            if (c >= '0' && c <= '9') {
                anyDigit = true;
            } else if (c == '.' && !dot) {
                dot = true;
            } else {
                break;
            }
            pos++;
        }
        int numberEnd = pos;
        if (!anyDigit) {
            throw syntax(shown, pos);
        }
        while (pos < end && Character.isWhitespace(text.charAt(pos))) {
            pos++;
        }
        if (pos >= end || text.charAt(pos) != '%') {
            throw syntax(shown, pos);
        }
        pos++;
        if (pos != end) {
            throw syntax(shown, pos);
        }
        double percent = Double.parseDouble(text.substring(numberStart, numberEnd));
        if (!(percent > 0 && percent < 100)) {
            throw new ValueFormatException(
                    "tolerance '" + shown + "' must be greater than 0% and less than 100%", numberStart);
        }
        return new Tolerance(percent / 100);
    }

    /** The tolerance in percent: 1.0 for 1 %. */
    public double percent() {
        return fraction * 100;
    }

    /** Percent without trailing zeros and without a space: "1%", "0.5%", "0.1%". */
    @Override
    public String toString() {
        return new BigDecimal(percent()).round(PRINT_DIGITS).stripTrailingZeros().toPlainString() + "%";
    }

    private static ValueFormatException syntax(String shown, int offset) {
        return new ValueFormatException("expected a tolerance such as 1% or 0.5%, found '" + shown + "'", offset);
    }
}
