package org.roseate.tools;

import java.util.List;
import java.util.Objects;
import java.util.Optional;
import java.util.function.DoubleUnaryOperator;
import org.roseate.bands.BandFraction;
import org.roseate.circuit.Design;
import org.roseate.circuit.SourceNoise;
import org.roseate.compare.FrequencyRange;
import org.roseate.compare.TargetSlope;

/**
 * What to fit: a starting design whose topology is kept, the components whose values are free,
 * the target, and the search settings.
 *
 * @param start           the topology and the starting values
 * @param free            designators of the free components (R and C only); every other part is
 *                        held: its value is copied unchanged, bit for bit, into both answers
 * @param gain            a gain to hold, or empty to fit the shape alone (then the overall gain
 *                        goes wherever the shape takes it)
 * @param range           the frequency range compared
 * @param target          the target slope
 * @param fraction        the band width of the band deviation
 * @param series          the standard series per kind for the discrete search
 * @param limits          the allowed values per kind
 * @param starts          continuous starts, ≥ 1 (start 0 is the design's own values)
 * @param seed            seed for the random starts and the search
 * @param threads         worker threads, ≥ 1 (results do not depend on it)
 * @param pointwiseWeight weight w ≥ 0 of the pointwise peak in the objective
 *                        band peak + w·pointwise peak
 * @param source          the source whose relative density shape 1 + fc/f multiplies |H|² before
 *                        it is judged (as {@code analyze --with-source}), or empty to judge |H|²
 *                        alone (a white source)
 */
public record FitSpec(Design start, List<String> free, Optional<GainHold> gain, FrequencyRange range,
        TargetSlope target, BandFraction fraction, SeriesChoice series, PartLimits limits, int starts, long seed,
        int threads, double pointwiseWeight, Optional<SourceNoise> source) {
    /**
     * Default w: a tenth. The bar is the band peak; a small weight on the pointwise peak breaks
     * ties between designs with the same band peak in favour of the one with less ripple hidden
     * inside the bands, and costs the band peak almost nothing.
     */
    public static final double DEFAULT_POINTWISE_WEIGHT = 0.1;

    /** A spec judged with a white source (|H|² alone). */
    public FitSpec(Design start, List<String> free, Optional<GainHold> gain, FrequencyRange range,
            TargetSlope target, BandFraction fraction, SeriesChoice series, PartLimits limits, int starts, long seed,
            int threads, double pointwiseWeight) {
        this(start, free, gain, range, target, fraction, series, limits, starts, seed, threads, pointwiseWeight, Optional.empty());
    }

    public FitSpec {
        Objects.requireNonNull(start, "start");
        Objects.requireNonNull(source, "source");
        free = List.copyOf(free);
        Objects.requireNonNull(gain, "gain");
        Objects.requireNonNull(range, "range");
        Objects.requireNonNull(target, "target");
        Objects.requireNonNull(fraction, "fraction");
        Objects.requireNonNull(series, "series");
        Objects.requireNonNull(limits, "limits");
        if (free.isEmpty()) {
            throw new IllegalArgumentException("no free components to fit");
        }
        for (String d : free) {
            var c = start.component(d)
                    .orElseThrow(() -> new IllegalArgumentException("free component " + d + " is not in the design"));
            if (c.kind() == org.roseate.value.ComponentKind.INDUCTOR) {
                throw new IllegalArgumentException(d + " is an inductor; fit frees resistors and capacitors only (hold it)");
            }
        }
        if (starts < 1 || threads < 1) {
            throw new IllegalArgumentException("starts=" + starts + ", threads=" + threads + " must be >= 1");
        }
        if (!(pointwiseWeight >= 0) || !Double.isFinite(pointwiseWeight)) {
            throw new IllegalArgumentException("pointwiseWeight=" + pointwiseWeight + " must be finite and >= 0");
        }
    }

    /** The relative source density shape f ↦ 1 + fc/f (dimensionless, f in Hz); 1 without a source. */
    public DoubleUnaryOperator sourceShape() {
        return source.<DoubleUnaryOperator>map(src -> src::shape).orElse(hz -> 1.0);
    }
}
