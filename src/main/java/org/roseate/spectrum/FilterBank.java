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
 * +0.20 dB (see {@link FractionalOctaveFilter#butterworthNoiseBandwidthRatio(int)}); on pink noise
 * +0.196 dB for third-octave and +0.165 dB for octave bands (the analog prototype, integrated with
 * scipy; tests: FilterBankLevelsTest). These are systematic: the bank reads that much above the FFT
 * reading ({@link BandLevels}) of the same noise, and the tests hold it to it.
 *
 * <p><b>Rates.</b> A band whose upper edge lies above a quarter of the input rate (at 48 kHz the
 * third-octave bands from 12.5 kHz and the 16 kHz octave; at 44.1 kHz also the 8 kHz octave and
 * 10 kHz third-octave) runs at twice the input rate, after a {@link HalfbandInterpolator} that is flat
 * to ±0.005 dB up to the highest such edge: there the bilinear warping that widened the low skirt at
 * the base rate is four times smaller, and every band meets the IEC 61260-1:2014 class 1 limits
 * (FilterBankDesignTest, through {@link #relativeAttenuationDb}). Bands whose upper edge is not
 * below half the input rate are refused.
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
    private int[] factors = new int[0];
    private final double[] scratch = new double[2 * CHUNK];
    private final double[] doubled = new double[2 * CHUNK];
    private HalfbandInterpolator interpolator;
    private long samples;

    /** Bands whose upper edge lies above this fraction of the input rate run at twice the rate. */
    public static final double DOUBLE_RATE_ABOVE_FRACTION = 0.25;

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
        int[] m = new int[table.size()];
        double topEdge = 0;
        for (int i = 0; i < table.size(); i++) {
            var band = table.band(i);
            if (!(band.highHz() < sampleRateHz / 2)) {
                throw new IllegalArgumentException("band " + band.label() + " reaches " + band.highHz()
                        + " Hz, not below half the sample rate " + sampleRateHz + " Hz");
            }
            m[i] = band.highHz() > DOUBLE_RATE_ABOVE_FRACTION * sampleRateHz ? 2 : 1;
            if (m[i] == 2) {
                topEdge = Math.max(topEdge, band.highHz());
            }
            d.add(FractionalOctaveFilter.design(band, m[i] * sampleRateHz));
        }
        this.interpolator = topEdge > 0 ? new HalfbandInterpolator(sampleRateHz, topEdge) : null;
        this.factors = m;
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
            if (interpolator != null) {
                interpolator.process(samples, offset + done, c, doubled);
            }
            for (int k = 0; k < filters.length; k++) {
                int len = c * factors[k];
                System.arraycopy(factors[k] == 1 ? samples : doubled, factors[k] == 1 ? offset + done : 0, buf, 0, len);
                filters[k].process(buf, 0, len);
                double s = sums[k];
                for (int i = 0; i < len; i++) {
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
        return sums[i] / ((double) samples * factors[i]);
    }

    /** 1 if band i runs at the input rate, 2 if at twice the input rate (see the class notes). */
    public int rateFactor(int i) {
        requirePrepared();
        return factors[i];
    }

    /**
     * Relative attenuation ΔA(f) = A(f) − A(fm), dB, of band i for a steady tone at {@code hz} (below half
     * the input rate), as the bank reads it: for a band at the input rate
     * {@link FractionalOctaveFilter#relativeAttenuationDb}; for a band at twice the rate the tone reaches the
     * band filter H_b as two lines, f through the interpolator's H_i(f) and its image fs − f through
     * H_i(fs − f), so the band's mean square is ∝ |H_i(f)·H_b(f)|² + |H_i(fs − f)·H_b(fs − f)|².
     */
    public double relativeAttenuationDb(int i, double hz) {
        requirePrepared();
        FractionalOctaveFilter f = designs.get(i);
        if (factors[i] == 1) {
            return f.relativeAttenuationDb(hz);
        }
        return 10 * Math.log10(doubledPower(f, f.band().midHz()) / doubledPower(f, hz));
    }

    private double doubledPower(FractionalOctaveFilter f, double hz) {
        double image = sampleRateHz - hz;
        double a = interpolator.response(hz).abs() * f.magnitude(hz);
        double b = interpolator.response(image).abs() * f.magnitude(image);
        return a * a + b * b;
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
        if (interpolator != null) {
            interpolator.reset();
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

    /** The band-pass designs, in table order; each at {@link #rateFactor}(i) times the input rate. */
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
