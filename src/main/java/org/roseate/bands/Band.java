package org.roseate.bands;

import java.math.BigDecimal;
import java.util.Objects;

/**
 * One base-ten fractional-octave band of IEC 61260-1:2014.
 *
 * <p>With octave ratio G = 10^(3/10) (5.2.1), reference frequency 1000 Hz and odd b (both
 * fractions here), the exact midband frequency of band index x is
 * fm = 1000 · G^(x/b) (5.2.2, eq. 2) and the band edges are fm · G^(∓1/(2b)) (5.3, eqs. 4
 * and 5). The edges are computed straight from the exponent, so the upper edge of band x is
 * the same double as the lower edge of band x + 1.
 *
 * <p>The nominal midband frequency is the preferred number of the R10 series (ISO 266,
 * ISO 3): 1, 1.25, 1.6, 2, 2.5, 3.15, 4, 5, 6.3, 8 times a power of ten for third-octave
 * bands, ten bands per decade since G^(10/3) = 10; an octave band takes every third one
 * (31.5, 63, 125, …, 16000 Hz).
 *
 * @param index     x, band number relative to the 1 kHz band (x = 0), within
 *                  [{@link #minIndex}, {@link #maxIndex}] of the fraction
 * @param fraction  octave or one-third octave
 * @param nominalHz the preferred-number label frequency, Hz
 * @param midHz     the exact midband frequency fm, Hz
 * @param lowHz     the lower band-edge frequency, Hz
 * @param highHz    the upper band-edge frequency, Hz
 */
public record Band(int index, BandFraction fraction, double nominalHz, double midHz, double lowHz, double highHz) {
    /** Lowest nominal midband supported, Hz: the 0.4 Hz third-octave band (sub-audio control work). */
    public static final double MIN_NOMINAL_HZ = 0.4;
    /** Highest nominal midband supported, Hz: the 100 kHz third-octave band. */
    public static final double MAX_NOMINAL_HZ = 100_000;

    /** Preferred numbers of the R10 series, in hundredths. */
    private static final int[] R10_HUNDREDTHS = {100, 125, 160, 200, 250, 315, 400, 500, 630, 800};
    /** Third-octave index of the 0.4 Hz and 100 kHz bands. */
    private static final int MIN_THIRD_INDEX = -34;
    private static final int MAX_THIRD_INDEX = 20;
    /** Agreement required between given and computed frequencies in the canonical constructor. */
    private static final double CONSISTENCY_RELATIVE = 1e-12;

    /**
     * Checks that the frequencies are the standard's for (index, fraction), so every Band
     * in circulation is a real one; prefer {@link #of}.
     *
     * @throws IllegalArgumentException if the index is out of range or a frequency differs
     *                                  from the computed one by more than 1e-12 relative
     */
    public Band {
        Objects.requireNonNull(fraction, "fraction");
        checkIndex(index, fraction);
        check("nominalHz", nominalHz, nominalHz(index, fraction));
        check("midHz", midHz, edgeHz(2 * index, fraction));
        check("lowHz", lowHz, edgeHz(2 * index - 1, fraction));
        check("highHz", highHz, edgeHz(2 * index + 1, fraction));
    }

    /**
     * The band with index x of the given fraction.
     *
     * @throws IllegalArgumentException if x is outside [{@link #minIndex}, {@link #maxIndex}]
     */
    public static Band of(int index, BandFraction fraction) {
        Objects.requireNonNull(fraction, "fraction");
        checkIndex(index, fraction);
        return new Band(index, fraction, nominalHz(index, fraction), edgeHz(2 * index, fraction),
                edgeHz(2 * index - 1, fraction), edgeHz(2 * index + 1, fraction));
    }

    /** Lowest supported index: −34 (0.4 Hz) for third-octave, −11 (0.5 Hz) for octave. */
    public static int minIndex(BandFraction fraction) {
        return -Math.floorDiv(-MIN_THIRD_INDEX, thirdsPerBand(fraction));
    }

    /** Highest supported index: 20 (100 kHz) for third-octave, 6 (63 kHz) for octave. */
    public static int maxIndex(BandFraction fraction) {
        return Math.floorDiv(MAX_THIRD_INDEX, thirdsPerBand(fraction));
    }

    /** Bandwidth highHz − lowHz, Hz. */
    public double widthHz() {
        return highHz - lowHz;
    }

    /**
     * The nominal frequency as a short label: below 1000 Hz the plain number ("0.8", "16",
     * "31.5"), from 1000 Hz up in kilohertz with a "k" ("1k", "12.5k", "20k").
     */
    public String label() {
        BigDecimal nominal = nominalDecimal(index, fraction);
        if (nominal.compareTo(BigDecimal.valueOf(1000)) < 0) {
            return nominal.stripTrailingZeros().toPlainString();
        }
        return nominal.movePointLeft(3).stripTrailingZeros().toPlainString() + "k";
    }

    /**
     * 1000 · 10^(3·halfSteps / (20·b)): the midband for halfSteps = 2x, edges for 2x ∓ 1.
     * This is the odd-b form of the standard's equation, which both fractions here use.
     */
    private static double edgeHz(int halfSteps, BandFraction fraction) {
        return 1000 * Math.pow(10, 3.0 * halfSteps / (20.0 * fraction.b()));
    }

    private static double nominalHz(int index, BandFraction fraction) {
        return nominalDecimal(index, fraction).doubleValue();
    }

    /** The R10 preferred number of the band, exact as a decimal. */
    private static BigDecimal nominalDecimal(int index, BandFraction fraction) {
        int third = index * thirdsPerBand(fraction);
        int decade = Math.floorDiv(third, 10);
        int step = Math.floorMod(third, 10);
        // 1000 Hz is R10_HUNDREDTHS[0] = 100 hundredths times 10^3, hence the exponent 3 - 2.
        return BigDecimal.valueOf(R10_HUNDREDTHS[step]).scaleByPowerOfTen(decade + 1);
    }

    /** How many third-octave steps one band spans: 3 for octave, 1 for third-octave. */
    private static int thirdsPerBand(BandFraction fraction) {
        return 3 / fraction.b();
    }

    private static void checkIndex(int index, BandFraction fraction) {
        if (index < minIndex(fraction) || index > maxIndex(fraction)) {
            throw new IllegalArgumentException("index=" + index + " must be within [" + minIndex(fraction)
                    + ", " + maxIndex(fraction) + "] for " + fraction.displayName() + " bands");
        }
    }

    private static void check(String name, double given, double expected) {
        if (!(Math.abs(given - expected) <= CONSISTENCY_RELATIVE * expected)) {
            throw new IllegalArgumentException(name + "=" + given + " does not match the standard's "
                    + expected + " for this band");
        }
    }
}
