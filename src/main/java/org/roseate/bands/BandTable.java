package org.roseate.bands;

import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import java.util.Optional;

/**
 * A contiguous run of bands of one fraction, in ascending frequency, as used to integrate a
 * density or to compare a response band by band. Immutable.
 *
 * @param fraction the fraction every band shares
 * @param bands    the bands, at least one, with consecutive indexes
 */
public record BandTable(BandFraction fraction, List<Band> bands) {
    /** Slack on the range bounds of {@link #of} and on nominal lookups, relative. */
    public static final double RELATIVE_SLACK = 1e-9;

    /**
     * @throws IllegalArgumentException if bands is empty, mixes fractions or skips an index
     */
    public BandTable {
        Objects.requireNonNull(fraction, "fraction");
        bands = List.copyOf(bands);
        if (bands.isEmpty()) {
            throw new IllegalArgumentException("a band table needs at least one band");
        }
        for (int i = 0; i < bands.size(); i++) {
            Band b = bands.get(i);
            if (b.fraction() != fraction) {
                throw new IllegalArgumentException("band " + b.label() + " is " + b.fraction().displayName()
                        + ", table is " + fraction.displayName());
            }
            if (i > 0 && b.index() != bands.get(i - 1).index() + 1) {
                throw new IllegalArgumentException("band index " + b.index() + " does not follow "
                        + bands.get(i - 1).index());
            }
        }
    }

    /**
     * The bands whose nominal midband frequency lies within [loHz, hiHz], each bound widened
     * by {@value #RELATIVE_SLACK} relative. Third-octave 20 … 20000 Hz gives the 31 bands
     * from 20 Hz to 20 kHz; octave 20 … 20000 Hz gives the 10 bands from 31.5 Hz to 16 kHz.
     * Bands exist from {@link Band#MIN_NOMINAL_HZ} to {@link Band#MAX_NOMINAL_HZ} (octave:
     * 0.5 Hz to 63 kHz).
     *
     * @param loHz finite, &gt; 0, Hz
     * @param hiHz finite, &gt; loHz, Hz
     * @throws IllegalArgumentException if the range is not 0 &lt; loHz &lt; hiHz, finite, or
     *                                  holds no supported band
     */
    public static BandTable of(BandFraction fraction, double loHz, double hiHz) {
        Objects.requireNonNull(fraction, "fraction");
        if (!(loHz > 0) || !Double.isFinite(loHz) || !Double.isFinite(hiHz) || !(loHz < hiHz)) {
            throw new IllegalArgumentException("loHz=" + loHz + ", hiHz=" + hiHz
                    + " must be finite with 0 < loHz < hiHz");
        }
        double from = loHz * (1 - RELATIVE_SLACK);
        double to = hiHz * (1 + RELATIVE_SLACK);
        List<Band> selected = new ArrayList<>();
        for (int x = Band.minIndex(fraction); x <= Band.maxIndex(fraction); x++) {
            Band b = Band.of(x, fraction);
            if (b.nominalHz() >= from && b.nominalHz() <= to) {
                selected.add(b);
            }
        }
        if (selected.isEmpty()) {
            throw new IllegalArgumentException("no " + fraction.displayName() + " band has its nominal midband in ["
                    + loHz + ", " + hiHz + "] Hz; supported nominal midbands are " + Band.MIN_NOMINAL_HZ
                    + " to " + Band.MAX_NOMINAL_HZ + " Hz");
        }
        return new BandTable(fraction, selected);
    }

    /** Number of bands, ≥ 1. */
    public int size() {
        return bands.size();
    }

    /**
     * The i-th band, lowest first.
     *
     * @throws IndexOutOfBoundsException unless 0 ≤ i &lt; size()
     */
    public Band band(int i) {
        return bands.get(i);
    }

    /** Lower band edges, Hz, ascending; a fresh array. */
    public double[] lowHz() {
        double[] out = new double[bands.size()];
        for (int i = 0; i < out.length; i++) {
            out[i] = bands.get(i).lowHz();
        }
        return out;
    }

    /** Upper band edges, Hz, ascending; a fresh array. highHz()[i] == lowHz()[i + 1]. */
    public double[] highHz() {
        double[] out = new double[bands.size()];
        for (int i = 0; i < out.length; i++) {
            out[i] = bands.get(i).highHz();
        }
        return out;
    }

    /** Exact midband frequencies, Hz, ascending; a fresh array. */
    public double[] midHz() {
        double[] out = new double[bands.size()];
        for (int i = 0; i < out.length; i++) {
            out[i] = bands.get(i).midHz();
        }
        return out;
    }

    /**
     * The band whose nominal frequency equals {@code nominalHz} to {@value #RELATIVE_SLACK}
     * relative (find(31.5) gives the 31.5 Hz band; find(31.62) gives nothing); empty if
     * none in this table.
     */
    public Optional<Band> find(double nominalHz) {
        for (Band b : bands) {
            if (Math.abs(b.nominalHz() - nominalHz) <= RELATIVE_SLACK * b.nominalHz()) {
                return Optional.of(b);
            }
        }
        return Optional.empty();
    }

    /**
     * The band with lowHz ≤ hz &lt; highHz, so each frequency belongs to exactly one band;
     * empty if hz is outside the table (or NaN).
     */
    public Optional<Band> containing(double hz) {
        for (Band b : bands) {
            if (hz >= b.lowHz() && hz < b.highHz()) {
                return Optional.of(b);
            }
        }
        return Optional.empty();
    }
}
