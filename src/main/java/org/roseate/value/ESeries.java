package org.roseate.value;

import java.util.Locale;
import java.util.Optional;

/**
 * The preferred-number series for resistors and capacitors of IEC 60063:2015.
 *
 * <p>E3 … E24 have two significant digits and are the standard's published table, which
 * departs from the geometric ideal at 2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7 and 8.2; E12, E6 and
 * E3 take every second, fourth and eighth member of E24. E48, E96 and E192 have three
 * significant digits and are the ideal 10^(i/N) rounded half up to three digits, except that
 * E192 has 9.20 where the rounding gives 9.19 (the one exception the standard lists).
 *
 * <p>A standard value is a mantissa times a power of ten, for any decade a double can hold.
 * Values are returned as the double nearest the decimal (4.7e-9 is the same double as
 * {@code Double.parseDouble("4.7e-9")}). Comparisons with a standard value allow
 * {@value #RELATIVE_SLACK} relative, so values that went through arithmetic still match.
 */
public enum ESeries {
    E3(3), E6(6), E12(12), E24(24), E48(48), E96(96), E192(192);

    /** Relative slack when deciding whether a value equals a standard value. */
    public static final double RELATIVE_SLACK = 1e-9;

    private final int valuesPerDecade;
    /** Mantissas times 100, ascending, in [100, 1000). */
    private final int[] hundredths;

    ESeries(int valuesPerDecade) {
        this.valuesPerDecade = valuesPerDecade;
        this.hundredths = table(valuesPerDecade);
    }

    private static int[] table(int n) {
        int[] h = new int[n];
        if (n <= 24) {
            int stride = 24 / n;
            for (int i = 0; i < n; i++) {
                h[i] = Tables.E24_HUNDREDTHS[i * stride];
            }
            return h;
        }
        for (int i = 0; i < n; i++) {
            // 10^(i/n) * 100 is never within 0.001 of a half for n = 48, 96, 192.
            h[i] = (int) Math.round(100 * Math.pow(10, (double) i / n));
        }
        if (n == 192) {
            h[Tables.E192_EXCEPTION_INDEX] = Tables.E192_EXCEPTION_HUNDREDTHS;
        }
        return h;
    }

    /** Number of standard values per decade: 3, 6, …, 192. */
    public int valuesPerDecade() {
        return valuesPerDecade;
    }

    /** A fresh copy of the mantissas of one decade, ascending, in [1, 10): {1.0, 2.2, 4.7} for E3. */
    public double[] mantissas() {
        double[] m = new double[valuesPerDecade];
        for (int i = 0; i < m.length; i++) {
            m[i] = hundredths[i] / 100.0;
        }
        return m;
    }

    /**
     * The standard value nearest to {@code value} in the logarithmic sense (smallest
     * |log(value/s)|), across decade boundaries: E12 nearest 9.6 is 10. A value exactly at
     * the geometric midpoint of two standard values goes to the larger.
     *
     * @param value finite and &gt; 0
     * @throws IllegalArgumentException if value is not finite and &gt; 0
     */
    public double nearest(double value) {
        checkPositive("value", value);
        long k = floorIndex(value);
        double below = valueAt(k);
        double above = valueAt(k + 1);
        return Math.log(value / below) < Math.log(above / value) ? below : above;
    }

    /**
     * The smallest standard value strictly above {@code value}; for a value that is itself
     * standard (to {@value #RELATIVE_SLACK} relative), the next one up: E12 stepUp(4700) is 5600.
     *
     * @param value finite and &gt; 0
     * @throws IllegalArgumentException if value is not finite and &gt; 0
     */
    public double stepUp(double value) {
        checkPositive("value", value);
        double threshold = value * (1 + RELATIVE_SLACK);
        long k = floorIndex(threshold);
        while (valueAt(k) <= threshold) {
            k++;
        }
        return valueAt(k);
    }

    /**
     * The largest standard value strictly below {@code value}; for a value that is itself
     * standard (to {@value #RELATIVE_SLACK} relative), the next one down: E12 stepDown(4700)
     * is 3900.
     *
     * @param value finite and &gt; 0
     * @throws IllegalArgumentException if value is not finite and &gt; 0
     */
    public double stepDown(double value) {
        checkPositive("value", value);
        double threshold = value * (1 - RELATIVE_SLACK);
        long k = floorIndex(threshold);
        while (valueAt(k) >= threshold) {
            k--;
        }
        return valueAt(k);
    }

    /**
     * All standard values v with lo ≤ v ≤ hi (each bound widened by {@value #RELATIVE_SLACK}
     * relative), ascending; empty if none.
     *
     * @param lo finite, &gt; 0
     * @param hi finite, ≥ lo
     * @throws IllegalArgumentException if a bound is not finite and &gt; 0, or lo &gt; hi
     */
    public double[] valuesBetween(double lo, double hi) {
        checkPositive("lo", lo);
        checkPositive("hi", hi);
        if (lo > hi) {
            throw new IllegalArgumentException("lo=" + lo + " must be <= hi=" + hi);
        }
        double from = lo * (1 - RELATIVE_SLACK);
        double to = hi * (1 + RELATIVE_SLACK);
        long first = floorIndex(from);
        if (valueAt(first) < from) {
            first++;
        }
        long last = floorIndex(to);
        int count = (int) Math.max(0, last - first + 1);
        double[] out = new double[count];
        for (int i = 0; i < count; i++) {
            out[i] = valueAt(first + i);
        }
        return out;
    }

    /**
     * Whether {@code value} is a standard value of this series, to {@value #RELATIVE_SLACK}
     * relative. False for zero, negative and non-finite values.
     */
    public boolean contains(double value) {
        if (!(value > 0) || !Double.isFinite(value)) {
            return false;
        }
        double s = nearest(value);
        return Math.abs(s - value) <= RELATIVE_SLACK * value;
    }

    /** The series named {@code text} ("E24", "e96", surrounding spaces ignored), or empty. */
    public static Optional<ESeries> parse(String text) {
        if (text == null) {
            return Optional.empty();
        }
        String t = text.trim().toUpperCase(Locale.ROOT);
        for (ESeries s : values()) {
            if (s.name().equals(t)) {
                return Optional.of(s);
            }
        }
        return Optional.empty();
    }

    /** The index k of the largest standard value ≤ v; index 0 is 1.0, index N is 10. */
    private long floorIndex(double v) {
        long k = (long) Math.floor(Math.log10(v) * valuesPerDecade);
        while (valueAt(k) > v) {
            k--;
        }
        while (valueAt(k + 1) <= v) {
            k++;
        }
        return k;
    }

    /** The standard value with global index k: hundredths[k mod N] × 10^(floor(k/N) − 2). */
    private double valueAt(long k) {
        int n = valuesPerDecade;
        long decade = Math.floorDiv(k, n);
        int h = hundredths[Math.floorMod(k, n)];
        long e = decade - 2;
        if (e >= 0 && e < Tables.POW10.length) {
            return h * Tables.POW10[(int) e];
        }
        if (e < 0 && -e < Tables.POW10.length) {
            return h / Tables.POW10[(int) -e];
        }
        return Double.parseDouble(h + "E" + e);
    }

    private static void checkPositive(String name, double v) {
        if (!(v > 0) || !Double.isFinite(v)) {
            throw new IllegalArgumentException(name + "=" + v + " must be finite and > 0");
        }
    }

    /** Constants the enum constructor needs; an enum's own statics are not yet set when it runs. */
    private static final class Tables {
        /** IEC 60063:2015, E24, in hundredths (the standard's two-digit values times 100). */
        private static final int[] E24_HUNDREDTHS = {
            100, 110, 120, 130, 150, 160, 180, 200, 220, 240, 270, 300,
            330, 360, 390, 430, 470, 510, 560, 620, 680, 750, 820, 910,
        };
        /** IEC 60063:2015 lists 9.20 in E192 (index 185) where rounding 10^(185/192) gives 9.19. */
        private static final int E192_EXCEPTION_INDEX = 185;
        private static final int E192_EXCEPTION_HUNDREDTHS = 920;

        /** Exact powers of ten as doubles; 10^22 is the largest exactly representable. */
        private static final double[] POW10 = new double[23];

        static {
            POW10[0] = 1;
            for (int i = 1; i < POW10.length; i++) {
                POW10[i] = POW10[i - 1] * 10;
            }
        }
    }
}
