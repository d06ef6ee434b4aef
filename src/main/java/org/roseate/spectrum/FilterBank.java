package org.roseate.spectrum;

import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import org.roseate.bands.BandTable;
import org.roseate.digital.SosFilter;

/**
 * Fractional-octave band levels in the time domain: one {@link FractionalOctaveFilter} per band of a
 * {@link BandTable} (IEC 61260-1:2014 base-ten bands), each followed by a mean-square average. A second
 * way to read band levels besides the Welch path ({@link BandLevels}); for white noise it reads higher
 * than the ideal band by the filter's noise bandwidth, 10·log10(noiseBandwidthHz/(f₂ − f₁)), about
 * +0.20 dB (see {@link FractionalOctaveFilter#butterworthNoiseBandwidthRatio(int)}). All bands run
 * at the input rate; see {@link FractionalOctaveFilter} for the bands near Nyquist that miss class 1
 * at 44.1 and 48 kHz.
 *
 * <p>Life cycle: {@link #prepare} designs the filters and allocates; {@link #accept} takes any n ≥ 0,
 * allocates nothing, and gives bitwise the same state and sums whether a signal comes whole or in
 * blocks of any sizes; {@link #levels()} returns an immutable snapshot (and allocates it);
 * {@link #restartAveraging()} clears the sums but keeps the filter state (to skip the filters' settling
 * time); {@link #reset()} clears both. The average is linear over all samples since the last reset or
 * restart, including the filters' start-up transient (about 1/(f₂ − f₁) seconds).
 *
 * <p>Threading: not thread-safe; feed and read from one analysis thread.
 */
public final class FilterBank {
    /** Samples filtered per pass through the bands (the scratch buffer length). */
    public static final int CHUNK = 512;

    private double sampleRateHz = Double.NaN;
    private BandTable table;
    private List<FractionalOctaveFilter> designs = List.of();
    private SosFilter[] filters = new SosFilter[0];
    private double[] sums = new double[0];
    private final double[] scratch = new double[CHUNK];
    private long samples;

    /**
     * Designs one band-pass per band at {@code sampleRateHz} and clears all state.
     *
     * @param sampleRateHz finite, &gt; 0, Hz
     * @param table        the bands; every upper edge must lie below sampleRateHz/2
     * @throws IllegalArgumentException if the rate is not finite and positive or a band cannot be designed
     *                                  (see {@link FractionalOctaveFilter#design})
     */
    public void prepare(double sampleRateHz, BandTable table) {
        Objects.requireNonNull(table, "table");
        if (!(sampleRateHz > 0) || !Double.isFinite(sampleRateHz)) {
            throw new IllegalArgumentException("sampleRateHz=" + sampleRateHz + " must be finite and > 0");
        }
        List<FractionalOctaveFilter> d = new ArrayList<>(table.size());
        for (int i = 0; i < table.size(); i++) {
            d.add(FractionalOctaveFilter.design(table.band(i), sampleRateHz));
        }
        SosFilter[] f = new SosFilter[d.size()];
        for (int i = 0; i < f.length; i++) {
            f[i] = new SosFilter(d.get(i).sos());
        }
        this.sampleRateHz = sampleRateHz;
        this.table = table;
        this.designs = List.copyOf(d);
        this.filters = f;
        this.sums = new double[f.length];
        this.samples = 0;
    }

    /**
     * Filters samples[offset … offset + n) (full scale ±1) through every band and adds the squared outputs
     * to the band sums. Any n ≥ 0; allocates nothing.
     *
     * @throws IllegalStateException    before prepare
     * @throws IllegalArgumentException if the range lies outside the array
     */
    public void accept(double[] samples, int offset, int n) {
        requirePrepared();
        if (offset < 0 || n < 0 || offset > samples.length - n) {
            throw new IllegalArgumentException("offset=" + offset + ", n=" + n + " outside an array of "
                    + samples.length);
        }
        double[] buf = scratch;
        int done = 0;
        while (done < n) {
            int c = Math.min(CHUNK, n - done);
            for (int k = 0; k < filters.length; k++) {
                System.arraycopy(samples, offset + done, buf, 0, c);
                filters[k].process(buf, 0, c);
                double s = sums[k];
                for (int i = 0; i < c; i++) {
                    double y = buf[i];
                    s += y * y;
                }
                sums[k] = s;
            }
            done += c;
        }
        this.samples += n;
    }

    /** Samples averaged since the last reset or restart. */
    public long samples() {
        return samples;
    }

    /**
     * Mean square of band i's output, FS².
     *
     * @throws IllegalStateException     before prepare or before any sample
     * @throws IndexOutOfBoundsException unless 0 ≤ i &lt; table().size()
     */
    public double meanSquare(int i) {
        requireSamples();
        return sums[i] / samples;
    }

    /** 10·log10(2·meanSquare(i)), dBFS; same conditions as {@link #meanSquare}. */
    public double levelDbfs(int i) {
        return 10 * Math.log10(2 * meanSquare(i));
    }

    /**
     * Every band's level, lowest band first.
     *
     * @throws IllegalStateException before prepare or before any sample
     */
    public List<FilterBankLevel> levels() {
        requireSamples();
        List<FilterBankLevel> out = new ArrayList<>(sums.length);
        for (int i = 0; i < sums.length; i++) {
            out.add(new FilterBankLevel(table.band(i), meanSquare(i), levelDbfs(i), samples));
        }
        return List.copyOf(out);
    }

    /** Clears the sums and the sample count; the filter state (and so the settled response) is kept. */
    public void restartAveraging() {
        requirePrepared();
        java.util.Arrays.fill(sums, 0);
        samples = 0;
    }

    /** Clears the filter state and the sums, as after prepare. */
    public void reset() {
        requirePrepared();
        for (SosFilter f : filters) {
            f.reset();
        }
        java.util.Arrays.fill(sums, 0);
        samples = 0;
    }

    /** The sample rate given to prepare, Hz. */
    public double sampleRateHz() {
        requirePrepared();
        return sampleRateHz;
    }

    /** The bands given to prepare. */
    public BandTable table() {
        requirePrepared();
        return table;
    }

    /** The band-pass designs, in table order. */
    public List<FractionalOctaveFilter> filters() {
        requirePrepared();
        return designs;
    }

    private void requirePrepared() {
        if (table == null) {
            throw new IllegalStateException("prepare(sampleRateHz, table) has not been called");
        }
    }

    private void requireSamples() {
        requirePrepared();
        if (samples == 0) {
            throw new IllegalStateException("no samples averaged yet");
        }
    }
}
