package org.roseate.listen;

import java.util.List;

/**
 * The result of a complete ABX test.
 *
 * @param correct                  number of correct answers
 * @param trials                   number of trials
 * @param pValue                   P(K ≥ correct) for a guessing listener ({@link Binomial#upperTail})
 * @param smallestSignificantCount the fewest correct answers with p ≤ 0.05 for this many trials
 */
public record AbxOutcome(int correct, int trials, double pValue, int smallestSignificantCount) {
    /** From the answered trials. */
    public static AbxOutcome of(List<AbxTrial> log) {
        int correct = (int) log.stream().filter(AbxTrial::correct).count();
        int n = log.size();
        return new AbxOutcome(correct, n, Binomial.upperTail(correct, n),
                Binomial.smallestSignificantCount(n, AbxSession.ALPHA));
    }

    /** Whether p ≤ 0.05. */
    public boolean significant() {
        return pValue <= AbxSession.ALPHA;
    }
}
