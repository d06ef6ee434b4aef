package org.roseate.tools;

import java.util.Locale;
import java.util.Optional;

/**
 * How a part's value spreads within its tolerance t in the Monte Carlo analysis.
 * {@link #UNIFORM}: value = nominal·(1 + t·u), u uniform on [−1, 1]. {@link #GAUSSIAN}:
 * value = nominal·(1 + (t/3)·z), z standard normal truncated to |z| ≤ 3, i.e. the tolerance is
 * taken as 3σ and no part lies outside it (common practice for parts that are tested and sorted).
 */
public enum Distribution {
    UNIFORM, GAUSSIAN;

    /** The σ of the Gaussian as a fraction of the tolerance: 1/3. */
    public static final double SIGMAS_PER_TOLERANCE = 3;

    /** "uniform" or "gaussian" (also "normal"), any case; empty otherwise. */
    public static Optional<Distribution> parse(String text) {
        return switch (text.trim().toLowerCase(Locale.ROOT)) {
            case "uniform" -> Optional.of(UNIFORM);
            case "gaussian", "normal" -> Optional.of(GAUSSIAN);
            default -> Optional.empty();
        };
    }
}
