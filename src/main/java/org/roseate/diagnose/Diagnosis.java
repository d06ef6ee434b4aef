package org.roseate.diagnose;

import java.util.List;

/**
 * The outcome of a diagnosis: each part's estimated value, the sets of parts the measurement cannot
 * tell apart, and how well the fitted model matches the measurement.
 *
 * @param parts              one estimate per part, in design order
 * @param ambiguityGroups    sets of designators whose joint change the capture cannot resolve better
 *                           than the tolerances already do (see {@link Diagnoser}); a group of one is
 *                           a part the capture cannot pin down on its own
 * @param residualDb         RMS of measured − fitted level over the trusted points, dB
 * @param residualDeg        RMS of measured − fitted phase over the trusted points with a phase,
 *                           degrees; NaN when no phase was fitted (noise sources)
 * @param phasePoints        trusted points whose phase entered the fit (0 for noise sources)
 * @param expectedResidualDb RMS of the points' standard uncertainties, dB: what residualDb would be
 *                           from the measurement's scatter alone
 * @param chiSquare          Σ((measured − fitted)/uncertainty)² over the trusted points, levels and
 *                           phases
 * @param degreesOfFreedom   fitted levels and phases minus the effective number of fitted parameters
 * @param misfitPValue       P(χ² ≥ chiSquare) for a correct model; tiny values mean no part values
 *                           explain the measurement (a missing, extra or swapped part)
 * @param levelOffsetDb      fitted overall level offset, dB, when the level is free; else NaN
 * @param points             every analysis point with the fitted and design curves
 * @param confidence         the confidence of intervals and flags, e.g. 0.95
 * @param iterations         Levenberg–Marquardt iterations used
 */
public record Diagnosis(List<PartEstimate> parts, List<List<String>> ambiguityGroups, double residualDb,
        double residualDeg, int phasePoints, double expectedResidualDb, double chiSquare, double degreesOfFreedom, double misfitPValue,
        double levelOffsetDb, List<FitPoint> points, double confidence, int iterations) {
    /** Below this χ² p-value the report says that no values explain the measurement. */
    public static final double MISFIT_P_VALUE = 1e-3;

    public Diagnosis {
        parts = List.copyOf(parts);
        ambiguityGroups = ambiguityGroups.stream().map(List::copyOf).toList();
        points = List.copyOf(points);
    }

    /** True when the residual is far beyond the measurement's scatter (p &lt; {@link #MISFIT_P_VALUE}). */
    public boolean modelMisfit() {
        return misfitPValue < MISFIT_P_VALUE;
    }

    /** The parts flagged outside their tolerance. */
    public List<PartEstimate> flagged() {
        return parts.stream().filter(PartEstimate::outOfTolerance).toList();
    }
}
