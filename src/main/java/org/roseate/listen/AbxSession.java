package org.roseate.listen;

import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import java.util.random.RandomGenerator;
import java.util.random.RandomGeneratorFactory;

/**
 * The bookkeeping of one ABX test: a fixed number of trials, each with a hidden X drawn at random
 * (A or B with probability ½ each, independently) from a seeded L64X128MixRandom, so the same seed
 * gives the same order.
 *
 * <p>The number of trials is fixed before the first one and there is no way to end early with a
 * result: testing after every trial and stopping when p &lt; 0.05 raises the false-positive rate
 * well above 5 % (optional stopping), so {@link #outcome()} exists only when every trial is answered.
 *
 * <p>Single-threaded; the adapter calls {@link #select} when the listener switches and
 * {@link #answer} when they decide.
 */
public final class AbxSession {
    /** What the listener can choose to hear. */
    public enum Choice { A, B, X }

    /** Significance level for the smallest significant count. */
    public static final double ALPHA = 0.05;

    private final int trials;
    private final long seed;
    private final List<Side> hidden;
    private final List<AbxTrial> answered = new ArrayList<>();
    private Choice playing;
    private int switches;
    private Instant trialStart;

    /**
     * @param trials number of trials, 5 to {@link Binomial#MAX_TRIALS} (below 5 no score can be
     *               significant at 5 %)
     * @param seed   seed of the trial order
     * @param start  when the first trial starts
     */
    public AbxSession(int trials, long seed, Instant start) {
        if (trials < 5 || trials > Binomial.MAX_TRIALS) {
            throw new IllegalArgumentException("trials=" + trials + " must be 5 to " + Binomial.MAX_TRIALS);
        }
        this.trials = trials;
        this.seed = seed;
        this.hidden = order(trials, seed);
        this.trialStart = Objects.requireNonNull(start, "start");
    }

    /** The hidden X of every trial for a seed: L64X128MixRandom(seed).nextBoolean() per trial, true = A. */
    public static List<Side> order(int trials, long seed) {
        RandomGenerator g = RandomGeneratorFactory.of("L64X128MixRandom").create(seed);
        List<Side> out = new ArrayList<>(trials);
        for (int i = 0; i < trials; i++) {
            out.add(g.nextBoolean() ? Side.A : Side.B);
        }
        return List.copyOf(out);
    }

    public int trials() {
        return trials;
    }

    public long seed() {
        return seed;
    }

    /** 1-based number of the trial in progress; trials + 1 once finished. */
    public int currentTrial() {
        return answered.size() + 1;
    }

    public boolean finished() {
        return answered.size() == trials;
    }

    /**
     * The listener chose what to hear; returns the side to play (X resolved to the hidden side).
     * A choice different from what was playing counts as a switch.
     */
    public Side select(Choice choice) {
        Objects.requireNonNull(choice, "choice");
        requireRunning();
        if (choice != playing) {
            switches++;
            playing = choice;
        }
        return choice == Choice.X ? hidden.get(answered.size()) : Side.valueOf(choice.name());
    }

    /** What the listener is hearing now, or null before the first selection of this trial. */
    public Choice playing() {
        return playing;
    }

    /**
     * Records the answer "X is {@code answer}" and starts the next trial.
     *
     * @return the recorded trial
     */
    public AbxTrial answer(Side answer, Instant now) {
        requireRunning();
        double seconds = Math.max(0, Duration.between(trialStart, now).toNanos() * 1e-9);
        AbxTrial t = new AbxTrial(currentTrial(), now, hidden.get(answered.size()), answer, switches, seconds);
        answered.add(t);
        switches = 0;
        playing = null;
        trialStart = now;
        return t;
    }

    /** The answered trials so far. */
    public List<AbxTrial> log() {
        return List.copyOf(answered);
    }

    /**
     * The result, once every trial is answered.
     *
     * @throws IllegalStateException before the last answer (no early result, see the class notes)
     */
    public AbxOutcome outcome() {
        if (!finished()) {
            throw new IllegalStateException("the test has " + (trials - answered.size()) + " trial(s) left");
        }
        return AbxOutcome.of(answered);
    }

    private void requireRunning() {
        if (finished()) {
            throw new IllegalStateException("all " + trials + " trials are answered");
        }
    }
}
