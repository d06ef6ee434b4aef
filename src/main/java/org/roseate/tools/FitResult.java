package org.roseate.tools;

import java.util.List;
import java.util.Optional;
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
 * @param gain               the gain held, if any
 * @param startGainDb        20·log10|H| of the start design at the held frequency (1 kHz when
 *                           no gain is held), dB, through {@link org.roseate.model.CircuitModel}
 * @param continuousGainDb   the same for {@code continuous}
 * @param snappedGainDb      the same for {@code snapped}
 * @param clamped            free parts whose starting value lay outside the limits and was moved
 *                           to the nearest limit before the fit
 * @param atLimit            free parts whose standard value sits on a limit (the fit wanted to go
 *                           further; widening {@code --limits} may help)
 * @param evaluations        objective evaluations spent
 * @param elapsedSeconds     wall time, s
 */
public record FitResult(Design continuous, Design snapped, FitScore continuousScore, FitScore snappedScore,
        DesignAnalysis continuousAnalysis, DesignAnalysis snappedAnalysis, Optional<GainHold> gain, double startGainDb,
        double continuousGainDb, double snappedGainDb, List<ClampedValue> clamped, List<String> atLimit,
        long evaluations, double elapsedSeconds) {

    public FitResult {
        clamped = List.copyOf(clamped);
        atLimit = List.copyOf(atLimit);
    }

    /**
     * One design's deviation from the target.
     *
     * @param maxBandDeviationDb centred band peak deviation, dB
     * @param maxDeviationDb     centred pointwise peak deviation, dB
     * @param gainErrorDb        gain at the held frequency minus the held gain, dB (0 when none held)
     * @param objective          the value minimised: band + w·pointwise + the gain term (on continuous
     *                           values {@link Fitter#GAIN_WEIGHT}·|gain error|, on standard values
     *                           {@link Fitter#STANDARD_GAIN_WEIGHT}·max(0, |gain error| −
     *                           {@link Fitter#STANDARD_GAIN_SLACK_DB}))
     */
    public record FitScore(double maxBandDeviationDb, double maxDeviationDb, double gainErrorDb, double objective) {
    }

    /**
     * A starting value moved into the limits.
     *
     * @param designator the part
     * @param fromValue  the value in the start design (Ω or F)
     * @param toValue    the limit it was moved to (Ω or F)
     */
    public record ClampedValue(String designator, double fromValue, double toValue) {
    }
}
