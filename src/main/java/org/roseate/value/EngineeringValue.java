package org.roseate.value;

import java.math.BigDecimal;
import java.math.MathContext;
import java.math.RoundingMode;
import java.util.Locale;
import java.util.Objects;

/**
 * Reading and writing component values in SI base units (ohms, farads, henries).
 *
 * <h2>Accepted text ({@link #parse})</h2>
 * Surrounding whitespace is ignored. Two forms are read:
 * <ul>
 *   <li><b>Letter-and-digit code</b> (IEC 60062): a multiplier letter stands in place of the
 *       decimal point, {@code 4k7} = 4700, {@code 2M2} = 2.2e6, {@code 3n3} = 3.3e-9,
 *       {@code 4R7} = 4.7, {@code 100R} = 100. The letter may lead ({@code R47} = 0.47,
 *       {@code k47} = 470, {@code p68} = 0.68e-12) or trail ({@code 680p}, {@code 1k}); at
 *       least one digit is required and no decimal point is allowed.</li>
 *   <li><b>Decimal number with optional SI prefix</b>: {@code 4.7k}, {@code 0.1u},
 *       {@code 1000}, {@code 1e-6}, {@code 4.7E3}, {@code .5}. Whitespace may stand between
 *       the number and its prefix or unit ({@code 4.7 kΩ}), so {@link #formatSi} output reads
 *       back. A prefix after an exponent ({@code 1e3k}) is refused as confusing.</li>
 * </ul>
 * Multiplier letters and prefixes, case-sensitive: {@code p} 1e-12, {@code n} 1e-9,
 * {@code u}, {@code µ} (U+00B5) or {@code μ} (U+03BC) 1e-6, {@code m} 1e-3 (milli),
 * {@code R} 1 (letter code only), {@code k} or {@code K} 1e3, {@code M} 1e6 (mega),
 * {@code G} 1e9, {@code T} 1e12. Either form may end in the unit of the kind being read:
 * {@code Ω} (U+03A9 or U+2126) or {@code ohm} (any case, also {@code ohms}) for a resistor,
 * {@code F} for a capacitor, {@code H} for an inductor ({@code 47kΩ}, {@code 22nF},
 * {@code 10mH}, {@code 2n2F}). A unit of another kind is an error.
 *
 * <p>Note: {@code R} always multiplies by one in the base unit, so for an inductor
 * {@code 4R7} is 4.7 H, not the 4.7 µH that SMD inductor markings mean by it.
 *
 * <p>Refused, with a {@link ValueFormatException} pointing at the offending character:
 * bad syntax ({@code 4kk7}, {@code 4k7k}, {@code 1..2}, {@code --1}, {@code 1e},
 * {@code +1}, empty text), zero, negative values, values that are not finite or that
 * overflow or underflow a double, and units that do not fit the kind.
 *
 * <h2>Written text</h2>
 * {@link #format} writes the letter code; {@link #formatSi} writes "4.7 kΩ". Both keep the
 * fewest significant digits (at least one) that reproduce the value to
 * {@value #ROUND_TRIP_RELATIVE} relative, so standard E-series values print with at most three.
 * Decimal values are converted to double with correct rounding, so a value read from
 * "4k7" equals the double nearest to 4700 and a printed standard value reads back exactly.
 */
public final class EngineeringValue {
    /** Relative error allowed when choosing how many digits {@link #format} prints. */
    public static final double ROUND_TRIP_RELATIVE = 1e-9;

    /** Letter-code letters for decimal exponents -12, -9, ..., 12 (index = exponent/3 + 4). */
    private static final char[] CODE_LETTERS = {'p', 'n', 'u', 'm', 'R', 'k', 'M', 'G', 'T'};
    /** SI prefixes for the same exponents; the empty prefix for exponent 0. */
    private static final String[] SI_PREFIXES = {"p", "n", "µ", "m", "", "k", "M", "G", "T"};
    /** Values below 10^MIN_DECADE or at and above 10^MAX_DECADE are written in scientific form. */
    private static final int MIN_DECADE = -15;
    private static final int MAX_DECADE = 15;

    private EngineeringValue() {
    }

    /**
     * Reads a component value in the SI base unit of {@code kind} (Ω, F or H); see the class
     * comment for the grammar.
     *
     * @param text the value as typed, e.g. "4k7", "22nF", "1.5 MΩ"
     * @param kind which unit suffix is allowed
     * @return the value, finite and &gt; 0
     * @throws ValueFormatException with {@link ValueFormatException#offset()} at the offending
     *                              character, when the text is not a positive finite value
     */
    public static double parse(String text, ComponentKind kind) {
        Objects.requireNonNull(text, "text");
        Objects.requireNonNull(kind, "kind");
        return new Reader(text, kind).read();
    }

    /**
     * Writes a value as IEC 60062 letter code with the letter for its engineering exponent in
     * place of the decimal point: 4700 → "4k7", 3.3e-9 → "3n3", 1e-6 → "1u",
     * 2.2e6 → "2M2", 100e-12 → "100p", 10e-3 → "10m". Conventions chosen here:
     * values in [1, 1000) carry the letter R ("4R7", "470R", "1R") so that the text can never
     * be mistaken for a bare number; resistances in [0.1, 1) are written with a leading R
     * ("R47", common practice for low-value resistors), other values below 1 use m;
     * micro is written as ASCII "u". Values below 1e-15 or from 1e15 up are written in
     * scientific form ("1.5e-16"). {@code parse(format(v), kind)} gives back v to
     * {@value #ROUND_TRIP_RELATIVE} relative, and exactly when v is the double nearest a
     * decimal of at most eight significant digits (every standard value is).
     *
     * @param value finite and &gt; 0, in the base unit of {@code kind}
     * @throws IllegalArgumentException if value is not finite and &gt; 0
     */
    public static String format(double value, ComponentKind kind) {
        checkPositive(value);
        Objects.requireNonNull(kind, "kind");
        BigDecimal d = shortestDecimal(value);
        int decade = leadingDecade(d);
        if (decade < MIN_DECADE || decade >= MAX_DECADE) {
            return scientific(d, decade);
        }
        if (kind == ComponentKind.RESISTOR && decade == -1) {
            return withLetter(plain(d), 'R');
        }
        int group = Math.max(Math.floorDiv(decade, 3), -4);
        return withLetter(plain(d.movePointLeft(3 * group)), CODE_LETTERS[group + 4]);
    }

    /**
     * Writes a value with an SI prefix and the unit symbol of {@code kind}, mantissa in
     * [1, 1000): 4700 → "4.7 kΩ", 3.3e-9 → "3.3 nF", 0.47 → "470 mΩ", 1e-6 → "1 µF"
     * (micro sign U+00B5). Digits as in {@link #format}; outside 1e-12 ... 1e15 the number
     * is written in scientific form ("1.5e-16 F"). The result reads back with {@link #parse}.
     *
     * @param value finite and &gt; 0, in the base unit of {@code kind}
     * @throws IllegalArgumentException if value is not finite and &gt; 0
     */
    public static String formatSi(double value, ComponentKind kind) {
        checkPositive(value);
        Objects.requireNonNull(kind, "kind");
        BigDecimal d = shortestDecimal(value);
        int decade = leadingDecade(d);
        int group = Math.floorDiv(decade, 3);
        if (group < -4 || group > 4) {
            return scientific(d, decade) + " " + kind.unitSymbol();
        }
        return plain(d.movePointLeft(3 * group)) + " " + SI_PREFIXES[group + 4] + kind.unitSymbol();
    }

    private static void checkPositive(double value) {
        if (!(value > 0) || !Double.isFinite(value)) {
            throw new IllegalArgumentException("value=" + value + " must be finite and > 0");
        }
    }

    /** The decimal with the fewest significant digits within ROUND_TRIP_RELATIVE of v. */
    private static BigDecimal shortestDecimal(double v) {
        // Double.toString gives at most 17 digits that read back as exactly v.
        BigDecimal exact = new BigDecimal(Double.toString(v));
        for (int digits = 1; digits < exact.precision(); digits++) {
            BigDecimal d = exact.round(new MathContext(digits, RoundingMode.HALF_EVEN));
            if (Math.abs(d.doubleValue() - v) <= ROUND_TRIP_RELATIVE * v) {
                return d;
            }
        }
        return exact;
    }

    /** Decimal exponent of the leading digit: 4700 → 3, 0.47 → -1. */
    private static int leadingDecade(BigDecimal d) {
        return d.precision() - d.scale() - 1;
    }

    private static String plain(BigDecimal d) {
        return d.stripTrailingZeros().toPlainString();
    }

    /** "4.7" → "4k7", "470" → "470k", "0.47" → "k47". */
    private static String withLetter(String plain, char letter) {
        int dot = plain.indexOf('.');
        if (dot < 0) {
            return plain + letter;
        }
        String whole = plain.substring(0, dot);
        return (whole.equals("0") ? "" : whole) + letter + plain.substring(dot + 1);
    }

    /** "1.5e-16": mantissa in [1, 10), lower-case e. */
    private static String scientific(BigDecimal d, int decade) {
        return plain(d.movePointLeft(decade)) + "e" + decade;
    }

    /** Exponent for a letter-code letter, or Integer.MIN_VALUE if c is none. */
    private static int letterExponent(char c) {
        return switch (c) {
            case 'R' -> 0;
            default -> prefixExponent(c);
        };
    }

    /** Exponent for an SI prefix, or Integer.MIN_VALUE if c is none. */
    private static int prefixExponent(char c) {
        return switch (c) {
            case 'p' -> -12;
            case 'n' -> -9;
            case 'u', '\u00B5', '\u03BC' -> -6;
            case 'm' -> -3;
            case 'k', 'K' -> 3;
            case 'M' -> 6;
            case 'G' -> 9;
            case 'T' -> 12;
            default -> Integer.MIN_VALUE;
        };
    }

    /** A one-use scanner over one text. */
    private static final class Reader {
        /** Exponents beyond this are clamped; the result is already 0 or infinite there. */
        private static final int EXPONENT_CLAMP = 100_000;

        private final String text;
        private final ComponentKind kind;
        private final int start;
        private final int end;
        private int pos;

        Reader(String text, ComponentKind kind) {
            this.text = text;
            this.kind = kind;
            int s = 0;
            int e = text.length();
            while (s < e && Character.isWhitespace(text.charAt(s))) {
                s++;
            }
            while (e > s && Character.isWhitespace(text.charAt(e - 1))) {
                e--;
            }
            this.start = s;
            this.end = e;
            this.pos = s;
        }

        double read() {
            if (start == end) {
                throw syntax(0);
            }
            int signPos = -1;
            if (text.charAt(pos) == '-') {
                signPos = pos++;
            }
            String word = text.substring(pos, end).toLowerCase(Locale.ROOT);
            if (word.equals("nan") || word.equals("inf") || word.equals("infinity")) {
                throw new ValueFormatException("value '" + trimmed() + "' is not a finite number", start);
            }
            String intDigits = digits();
            String fracDigits = "";
            long exponent;
            if (pos < end && letterExponent(text.charAt(pos)) != Integer.MIN_VALUE) {
                int letterPos = pos++;
                exponent = letterExponent(text.charAt(letterPos));
                fracDigits = digits();
                if (intDigits.isEmpty() && fracDigits.isEmpty()) {
                    throw syntax(letterPos);
                }
            } else {
                if (pos < end && text.charAt(pos) == '.') {
                    pos++;
                    fracDigits = digits();
                }
                if (intDigits.isEmpty() && fracDigits.isEmpty()) {
                    throw syntax(pos);
                }
                exponent = 0;
                boolean scientific = false;
                if (pos < end && (text.charAt(pos) == 'e' || text.charAt(pos) == 'E')) {
                    pos++;
                    exponent = signedExponent();
                    scientific = true;
                }
                skipWhitespace();
                if (!scientific && pos < end && prefixExponent(text.charAt(pos)) != Integer.MIN_VALUE) {
                    exponent += prefixExponent(text.charAt(pos));
                    pos++;
                }
            }
            skipWhitespace();
            if (pos < end) {
                unit();
            }
            if (pos != end) {
                throw syntax(pos);
            }
            return value(intDigits + fracDigits, exponent - fracDigits.length(), signPos);
        }

        private double value(String digits, long exponent, int signPos) {
            if (digits.chars().allMatch(ch -> ch == '0')) {
                throw new ValueFormatException("value '" + trimmed() + "' must be greater than zero", start);
            }
            double v = Double.parseDouble(digits + "E" + exponent);
            if (Double.isInfinite(v)) {
                throw new ValueFormatException("value '" + trimmed() + "' is too large to be a finite number", start);
            }
            if (v == 0) {
                throw new ValueFormatException("value '" + trimmed() + "' is too small to tell from zero", start);
            }
            if (signPos >= 0) {
                throw new ValueFormatException("value '" + trimmed() + "' is negative; " + kind.article() + " " + kind.noun()
                        + " value must be greater than zero", signPos);
            }
            return v;
        }

        private String digits() {
            int from = pos;
            while (pos < end && text.charAt(pos) >= '0' && text.charAt(pos) <= '9') {
                pos++;
            }
            return text.substring(from, pos);
        }

        private long signedExponent() {
            boolean negative = false;
            if (pos < end && (text.charAt(pos) == '+' || text.charAt(pos) == '-')) {
                negative = text.charAt(pos) == '-';
                pos++;
            }
            String d = digits();
            if (d.isEmpty()) {
                throw syntax(pos);
            }
            long e = 0;
            for (int i = 0; i < d.length() && e < EXPONENT_CLAMP; i++) {
                e = e * 10 + (d.charAt(i) - '0');
            }
            e = Math.min(e, EXPONENT_CLAMP);
            return negative ? -e : e;
        }

        private void skipWhitespace() {
            while (pos < end && Character.isWhitespace(text.charAt(pos))) {
                pos++;
            }
        }

        /** Reads a unit symbol at pos, checking that it fits the kind. */
        private void unit() {
            String rest = text.substring(pos, end);
            String lower = rest.toLowerCase(Locale.ROOT);
            ComponentKind unitKind;
            int length;
            if (rest.startsWith("\u03A9") || rest.startsWith("\u2126")) {
                unitKind = ComponentKind.RESISTOR;
                length = 1;
            } else if (lower.startsWith("ohms")) {
                unitKind = ComponentKind.RESISTOR;
                length = 4;
            } else if (lower.startsWith("ohm")) {
                unitKind = ComponentKind.RESISTOR;
                length = 3;
            } else if (rest.startsWith("F")) {
                unitKind = ComponentKind.CAPACITOR;
                length = 1;
            } else if (rest.startsWith("H")) {
                unitKind = ComponentKind.INDUCTOR;
                length = 1;
            } else {
                throw syntax(pos);
            }
            if (unitKind != kind) {
                throw new ValueFormatException("unit " + rest.substring(0, length) + " does not fit "
                        + kind.article() + " " + kind.noun() + " (expected " + kind.unitSymbol() + ")", pos);
            }
            pos += length;
        }

        private String trimmed() {
            return text.substring(start, end);
        }

        private ValueFormatException syntax(int offset) {
            return new ValueFormatException(
                    "expected a value such as 4k7 or 22n, found '" + trimmed() + "'", offset);
        }
    }
}
