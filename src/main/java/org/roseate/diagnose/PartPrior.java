package org.roseate.diagnose;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.roseate.circuit.Component;
import org.roseate.circuit.Design;
import org.roseate.value.Tolerance;

/**
 * What the design says about one part before any measurement: a prior on θ = ln(value/nominal).
 *
 * <p>Its core is normal, centred on the nominal, with the tolerance interval nominal·(1 ± t) taken
 * as ±{@link #K_SIGMA} standard deviations: σ = ln((1 + t)/(1 − t)) / (2·k). Treating a marked
 * tolerance as about two standard deviations (95 % of parts inside) is common practice for parts
 * whose makers do not publish their distribution.
 *
 * <p>A diagnosis exists to find parts that are not what the design says, so the prior also gives a
 * wrong part its due: with probability {@link #WRONG_PART_PROBABILITY} the part is drawn from a
 * broad normal of σ_w = {@link #WRONG_PART_SIGMA_LN} (a wrong value within a factor of ten either
 * way at ±2σ_w). The density is p(θ) = (1 − w)·N(θ; 0, σ²) + w·N(θ; 0, σ_w²). With the normal core
 * alone, one resistor 20 % low would be "explained" by moving every part a little along a
 * direction the measurement cannot see (all R up, all C down), flagging good parts; the broad
 * component makes one wrong part the cheaper explanation, as it usually is on the bench. Both
 * constants are our assumptions (one fitting error in a hundred parts; decade mix-ups such as 4k7
 * for 47k as the largest errors), not measured rates.
 *
 * @param designator reference designator, e.g. R3
 * @param nominal    the design's value in Ω, F or H
 * @param tolerance  the tolerance fraction t, 0 &lt; t &lt; 1
 */
public record PartPrior(String designator, double nominal, double tolerance) {
    /** k: the tolerance interval spans ±k standard deviations of the prior on ln(value). */
    public static final double K_SIGMA = 2;
    /** w: prior probability that a part is wrong rather than within its tolerance distribution. */
    public static final double WRONG_PART_PROBABILITY = 0.01;
    /** σ_w of a wrong part's ln(value): ln(10)/2, a factor of ten at two standard deviations. */
    public static final double WRONG_PART_SIGMA_LN = Math.log(10) / 2;

    public PartPrior {
        if (!(nominal > 0) || !Double.isFinite(nominal)) {
            throw new IllegalArgumentException(designator + ": nominal=" + nominal + " must be finite and > 0");
        }
        if (!(tolerance > 0 && tolerance < 1)) {
            throw new IllegalArgumentException(designator + ": tolerance=" + tolerance + " must be in (0, 1)");
        }
    }

    /** σ of the prior on ln(value), ln((1 + t)/(1 − t))/(2k). */
    public double sigmaLn() {
        return Math.log((1 + tolerance) / (1 - tolerance)) / (2 * K_SIGMA);
    }

    /**
     * The prior's cost c(θ) = −2·ln(p(θ)/p(0)) ≥ 0 (0 at the nominal).
     *
     * @param theta ln(value/nominal)
     */
    public double cost(double theta) {
        double s = sigmaLn();
        double sw = WRONG_PART_SIGMA_LN;
        double w = WRONG_PART_PROBABILITY;
        double a = -theta * theta / (2 * s * s);
        double b = -theta * theta / (2 * sw * sw);
        double ca = Math.log((1 - w) / s);
        double cb = Math.log(w / sw);
        double top = logSumExp(ca + a, cb + b);
        double bottom = logSumExp(ca, cb);
        return Math.max(0, -2 * (top - bottom));
    }

    /** dc/dθ, analytically: 2θ·(q/σ² + (1 − q)/σ_w²), q the core's posterior share at θ. */
    public double costSlope(double theta) {
        double s = sigmaLn();
        double sw = WRONG_PART_SIGMA_LN;
        double w = WRONG_PART_PROBABILITY;
        double la = Math.log((1 - w) / s) - theta * theta / (2 * s * s);
        double lb = Math.log(w / sw) - theta * theta / (2 * sw * sw);
        double q = 1 / (1 + Math.exp(lb - la));
        return 2 * theta * (q / (s * s) + (1 - q) / (sw * sw));
    }

    /**
     * The least-squares residual whose square is the cost: sign(θ)·√c(θ), smooth through 0 where
     * it behaves as θ/σ_0, 1/σ_0² = ((1 − w)/σ³ + w/σ_w³)/((1 − w)/σ + w/σ_w).
     */
    public double residual(double theta) {
        return Math.copySign(Math.sqrt(cost(theta)), theta);
    }

    /** d(residual)/dθ = c'(θ)/(2·√c(θ)), with its limit 1/σ_0 at θ = 0. */
    public double residualSlope(double theta) {
        double c = cost(theta);
        if (c < 1e-12) {
            double s = sigmaLn();
            double sw = WRONG_PART_SIGMA_LN;
            double w = WRONG_PART_PROBABILITY;
            return Math.sqrt(((1 - w) / (s * s * s) + w / (sw * sw * sw)) / ((1 - w) / s + w / sw));
        }
        return Math.abs(costSlope(theta)) / (2 * Math.sqrt(c));
    }

    /**
     * The prior's information at θ for the Laplace approximation, ½·c''(θ) (central difference of
     * the analytic slope), never below the broad component's 1/σ_w² where the mixture bends the
     * other way.
     */
    public double precisionAt(double theta) {
        double h = 1e-6;
        double curvature = (costSlope(theta + h) - costSlope(theta - h)) / (4 * h);
        double sw = WRONG_PART_SIGMA_LN;
        return Math.max(curvature, 1 / (sw * sw));
    }

    private static double logSumExp(double x, double y) {
        double m = Math.max(x, y);
        return m + Math.log(Math.exp(x - m) + Math.exp(y - m));
    }

    /** ln(1 − t), the lower tolerance limit as a log-ratio to nominal. */
    public double lowLimitLn() {
        return Math.log(1 - tolerance);
    }

    /** ln(1 + t), the upper tolerance limit as a log-ratio to nominal. */
    public double highLimitLn() {
        return Math.log(1 + tolerance);
    }

    /**
     * One prior per component of the design, in design order. A part's tolerance comes from
     * {@code overrides} (by designator, then by kind letter), else from the design (likewise).
     *
     * @throws MissingToleranceException naming the parts without any tolerance
     */
    public static List<PartPrior> of(Design design, Map<String, Tolerance> overrides) {
        Map<String, Tolerance> o = new LinkedHashMap<>(overrides);
        List<PartPrior> out = new ArrayList<>();
        List<String> missing = new ArrayList<>();
        for (Component c : design.components()) {
            Tolerance t = o.get(c.designator());
            if (t == null) {
                t = o.get(String.valueOf(c.kind().letter()));
            }
            if (t == null) {
                t = design.toleranceOf(c).orElse(null);
            }
            if (t == null) {
                missing.add(c.designator());
            } else {
                out.add(new PartPrior(c.designator(), c.value(), t.fraction()));
            }
        }
        if (!missing.isEmpty()) {
            throw new MissingToleranceException(missing);
        }
        return List.copyOf(out);
    }
}
