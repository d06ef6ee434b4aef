package org.roseate.listen;

import java.time.Instant;
import java.util.Objects;

/**
 * One answered trial.
 *
 * @param number   1-based trial number
 * @param time     when the answer was given (UTC)
 * @param x        what X really was
 * @param answer   what the listener said X was
 * @param switches how many times the listener changed what was playing during the trial, ≥ 0
 * @param seconds  time from the trial's start to the answer, ≥ 0
 */
public record AbxTrial(int number, Instant time, Side x, Side answer, int switches, double seconds) {
    public AbxTrial {
        Objects.requireNonNull(time, "time");
        Objects.requireNonNull(x, "x");
        Objects.requireNonNull(answer, "answer");
        if (number < 1 || switches < 0 || !(seconds >= 0)) {
            throw new IllegalArgumentException("trial " + number + ": number >= 1, switches >= 0 and seconds >= 0 required");
        }
    }

    /** Whether the answer named X correctly. */
    public boolean correct() {
        return x == answer;
    }
}
