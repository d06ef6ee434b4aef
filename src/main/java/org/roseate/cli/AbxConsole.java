package org.roseate.cli;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.PrintWriter;
import java.time.Clock;
import java.util.Locale;
import org.roseate.listen.AbxOutcome;
import org.roseate.listen.AbxSession;
import org.roseate.listen.AbxTrial;
import org.roseate.listen.Side;

/**
 * The terminal face of an ABX test: reads one key per line, drives an {@link AbxSession}, tells a
 * {@link Player} what to play and hands every answered trial to a {@link LogSink}. X's identity
 * is never printed before the end.
 */
final class AbxConsole {
    static final String KEYS = "Keys (type one and press Enter): a = play A, b = play B, x = play X, "
            + "xa = answer 'X is A', xb = answer 'X is B', h = this help, q = stop the test.";

    /** What the console asks of the sound. */
    interface Player {
        void play(Side side);

        void silence();
    }

    /** Receives the log after every answer (and once at the start, empty). */
    interface LogSink {
        void save(java.util.List<AbxTrial> log) throws IOException;
    }

    private final AbxSession session;
    private final Player player;
    private final LogSink sink;
    private final PrintWriter out;
    private final Clock clock;

    AbxConsole(AbxSession session, Player player, LogSink sink, PrintWriter out, Clock clock) {
        this.session = session;
        this.player = player;
        this.sink = sink;
        this.out = out;
        this.clock = clock;
    }

    /**
     * Runs until every trial is answered, 'q', or the end of the input.
     *
     * @return the outcome, or null when stopped early
     */
    AbxOutcome run(BufferedReader in) throws IOException {
        sink.save(session.log());
        out.println(KEYS);
        prompt();
        String line;
        while (!session.finished() && (line = in.readLine()) != null) {
            String key = line.trim().toLowerCase(Locale.ROOT);
            switch (key) {
                case "" -> {
                }
                case "a", "b", "x" -> {
                    AbxSession.Choice c = AbxSession.Choice.valueOf(key.toUpperCase(Locale.ROOT));
                    player.play(session.select(c));
                    out.println("  playing " + c);
                }
                case "xa", "xb" -> {
                    AbxTrial t = session.answer(key.equals("xa") ? Side.A : Side.B, clock.instant());
                    player.silence();
                    sink.save(session.log());
                    out.println(Numbers.f("  trial %d answered: X is %s (%d switch%s)", t.number(), t.answer(), t.switches(),
                            t.switches() == 1 ? "" : "es"));
                    if (!session.finished()) {
                        prompt();
                    }
                }
                case "h", "?", "help" -> out.println(KEYS);
                case "q", "quit" -> {
                    return stoppedEarly();
                }
                default -> out.println("  unknown key '" + line.trim() + "'. " + KEYS);
            }
            out.flush();
        }
        if (!session.finished()) {
            return stoppedEarly();
        }
        AbxOutcome o = session.outcome();
        out.println(Numbers.f("Correct: %d of %d.", o.correct(), o.trials()));
        out.println(Numbers.f("One-sided binomial p-value: %.4g (the chance of %d or more correct by guessing alone).",
                o.pValue(), o.correct()));
        if (o.smallestSignificantCount() <= o.trials()) {
            out.println(Numbers.f("Smallest count significant at 5 %%: %d of %d.", o.smallestSignificantCount(), o.trials()));
        }
        out.println(o.significant()
                ? "Significant at 5 %: the listener told A and B apart better than guessing would."
                : "Not significant at 5 %: this test does not show that A and B can be told apart "
                        + "(it does not prove they cannot).");
        out.flush();
        return o;
    }

    private AbxOutcome stoppedEarly() {
        player.silence();
        out.println(Numbers.f("Stopped after %d of %d trials: no p-value, since a test stopped early is not valid; "
                + "the log keeps the answered trials.", session.currentTrial() - 1, session.trials()));
        out.flush();
        return null;
    }

    private void prompt() {
        out.println(Numbers.f("Trial %d of %d: listen to a, b and x as often as you like, then answer xa or xb.",
                session.currentTrial(), session.trials()));
        out.flush();
    }
}
