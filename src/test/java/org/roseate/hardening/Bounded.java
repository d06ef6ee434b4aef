package org.roseate.hardening;

import java.time.Duration;
import org.junit.jupiter.api.Assertions;
import org.junit.jupiter.api.function.Executable;

/**
 * The per-input time bound of the fuzz tests. In regression mode (no {@code JAZZER_FUZZ}) each
 * seed runs under {@link Assertions#assertTimeoutPreemptively}; while fuzzing, libFuzzer's own
 * {@code -timeout} watchdog does the job (a JUnit timeout there would bound the whole session).
 */
final class Bounded {
    static final Duration PER_INPUT = Duration.ofSeconds(10);
    private static final boolean FUZZING = !System.getenv().getOrDefault("JAZZER_FUZZ", "").isEmpty();

    private Bounded() {
    }

    static void run(Executable body) throws Throwable {
        if (FUZZING) {
            body.execute();
        } else {
            Assertions.assertTimeoutPreemptively(PER_INPUT, body, "one input must finish within " + PER_INPUT);
        }
    }
}
