package org.roseate.tools;

import org.roseate.circuit.Design;
import org.roseate.compare.DesignAnalysis;

/**
 * The fitter's answer: the continuous optimum and its standard-value version, each with the
 * optimiser's own score and an independent {@link DesignAnalysis} (built through
 * {@link org.roseate.model.CircuitModel}, not the optimiser's evaluator).
 *
 * @param continuous         the continuous optimum (values not standard)
 * @param snapped            the best standard-value design found
 * @param continuousScore    the optimiser's score of {@code continuous}
 * @param snappedScore       the optimiser's score of {@code snapped}
 * @param continuousAnalysis the independent analysis of {@code continuous}
 * @param snappedAnalysis    the independent analysis of {@code snapped}
 * @param evaluations        objective evaluations spent
 * @param elapsedSeconds     wall time, s
 */
public record FitResult(Design continuous, Design snapped, FitScore continuousScore, FitScore snappedScore,
        DesignAnalysis continuousAnalysis, DesignAnalysis snappedAnalysis, long evaluations, double elapsedSeconds) {

    /**
     * One design's deviation from the target.
     *
     * @param maxBandDeviationDb centred band peak deviation, dB
     * @param maxDeviationDb     centred pointwise peak deviation, dB
     * @param objective          the value minimised: band + w·pointwise
     */
    public record FitScore(double maxBandDeviationDb, double maxDeviationDb, double objective) {
    }
}
