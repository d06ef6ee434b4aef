package org.roseate.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.BufferedReader;
import java.io.PrintWriter;
import java.io.StringReader;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Instant;
import java.time.ZoneOffset;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.condition.EnabledIfEnvironmentVariable;
import org.junit.jupiter.api.io.TempDir;
import org.roseate.listen.AbxLog;
import org.roseate.listen.AbxOutcome;
import org.roseate.listen.AbxSession;
import org.roseate.listen.AbxTrial;
import org.roseate.listen.Binomial;
import org.roseate.listen.Side;
import picocli.CommandLine;

class ListenTestCommandTest {
    /** Keys for one trial: listen to everything, then answer. */
    static String script(int trials, String answer) {
        StringBuilder sb = new StringBuilder("h\n");
        for (int i = 0; i < trials; i++) {
            sb.append("a\nb\nx\n\nzz\nx\nb\n").append(answer).append('\n');
        }
        return sb.toString();
    }

    @Test
    void aScriptedRunPlaysTheHiddenSideAndLogsEveryTrial() throws Exception {
        List<String> played = new ArrayList<>();
        AbxConsole.Player player = new AbxConsole.Player() {
            @Override
            public void play(Side side) {
                played.add(side.name());
            }

            @Override
            public void silence() {
                played.add("-");
            }
        };
        List<List<AbxTrial>> saved = new ArrayList<>();
        StringWriter text = new StringWriter();
        AbxSession session = new AbxSession(8, 11, Instant.parse("2026-12-02T02:00:00Z"));
        Clock clock = Clock.fixed(Instant.parse("2026-12-02T02:00:30Z"), ZoneOffset.UTC);
        AbxOutcome o = new AbxConsole(session, player, saved::add, new PrintWriter(text), clock)
                .run(new BufferedReader(new StringReader(script(8, "xa"))));
        List<Side> order = AbxSession.order(8, 11);
        List<String> expected = new ArrayList<>();
        for (Side x : order) {
            expected.addAll(List.of("A", "B", x.name(), x.name(), "B", "-"));
        }
        assertEquals(expected, played);
        assertEquals(9, saved.size(), "saved once at the start and after each answer");
        List<AbxTrial> log = saved.get(8);
        long xIsA = order.stream().filter(s -> s == Side.A).count();
        assertEquals(xIsA, o.correct(), "answering 'X is A' every time is right exactly when X was A");
        for (AbxTrial t : log) {
            assertEquals(4, t.switches(), "a, b, x, (x again: no switch), b");
        }
        String out = text.toString();
        assertTrue(out.contains("unknown key 'zz'"), out);
        assertTrue(out.contains(Numbers.f("Correct: %d of 8.", o.correct())), out);
        assertTrue(out.contains(Numbers.f("%.4g", Binomial.upperTail(o.correct(), 8))), out);
        assertTrue(out.contains("Smallest count significant at 5 %: 7 of 8."), out); // 8 trials: P(K >= 7) = 9/256 = 0.035
    }

    /** Two seeds with different orders, the same keys: everything printed before the result is identical. */
    @Test
    void nothingPrintedDuringTheTestDependsOnTheHiddenX() throws Exception {
        assertTrue(!AbxSession.order(8, 11).equals(AbxSession.order(8, 12)), "the two seeds must give different orders");
        String[] before = new String[2];
        for (int i = 0; i < 2; i++) {
            StringWriter text = new StringWriter();
            AbxConsole.Player silent = new AbxConsole.Player() {
                @Override
                public void play(Side side) {
                }

                @Override
                public void silence() {
                }
            };
            new AbxConsole(new AbxSession(8, 11 + i, Instant.EPOCH), silent, log -> { }, new PrintWriter(text),
                    Clock.fixed(Instant.EPOCH, ZoneOffset.UTC)).run(new BufferedReader(new StringReader(script(8, "xa"))));
            String out = text.toString();
            before[i] = out.substring(0, out.indexOf("Correct:"));
        }
        assertEquals(before[0], before[1]);
    }

    @Test
    void stoppingEarlyGivesNoPValue() throws Exception {
        StringWriter text = new StringWriter();
        List<List<AbxTrial>> saved = new ArrayList<>();
        AbxConsole.Player silent = new AbxConsole.Player() {
            @Override
            public void play(Side side) {
            }

            @Override
            public void silence() {
            }
        };
        AbxOutcome o = new AbxConsole(new AbxSession(16, 1, Instant.EPOCH), silent, saved::add, new PrintWriter(text),
                Clock.systemUTC()).run(new BufferedReader(new StringReader("x\nxb\nx\nxa\nq\n")));
        assertNull(o);
        assertEquals(2, saved.get(saved.size() - 1).size());
        assertTrue(text.toString().contains("Stopped after 2 of 16 trials: no p-value"), text.toString());
        assertFalse(text.toString().contains("p-value:"), text.toString());
    }

    @Test
    void badArgumentsAreRefusedBeforeAnySound(@TempDir Path dir) throws Exception {
        Path existing = dir.resolve("old.json");
        Files.writeString(existing, "{}");
        String[][] cases = {
            {"listen-test", "white", "ideal-pink", "--level", "-5"},
            {"listen-test", "white", "ideal-pink", "--trials", "4"},
            {"listen-test", "white", "ideal-pink", "--log", existing.toString()},
            {"listen-test", "white", "ideal-pink", "--log", dir.resolve("x.txt").toString()},
            {"listen-test", "white", dir.resolve("missing.json").toString(), "--log", dir.resolve("n.json").toString()},
        };
        for (String[] c : cases) {
            AnalyzeCommandTest.Run r = AnalyzeCommandTest.run(c);
            assertEquals(2, r.status(), String.join(" ", c) + ": " + r.err());
            assertTrue(r.err().startsWith("roseate: "), r.err());
            assertEquals(1, r.err().strip().split("\n").length, r.err());
            assertFalse(r.out().contains("Caution"), "refused before the caution and the device: " + r.out());
        }
        assertEquals("{}", Files.readString(existing), "an existing log is never touched");
    }

    @Test
    void helpExplainsTheKeysAndWhyThereIsNoEarlyStop() {
        AnalyzeCommandTest.Run r = AnalyzeCommandTest.run("listen-test", "--help");
        assertEquals(0, r.status());
        String help = r.out().replaceAll("\\s+", " ");
        assertTrue(help.contains("xa = answer 'X is A'"), r.out());
        assertTrue(help.contains("cannot end early"), r.out());
        assertTrue(help.contains("more often than 5 %."), "percent signs formatted: " + r.out());
    }

    /**
     * The whole command on the virtual sound card (.ci/virtual-soundcard.sh), keys from a script
     * instead of standard input: five trials of a design against ideal pink, every answer "X is B".
     */
    @Test
    @EnabledIfEnvironmentVariable(named = "ROSEATE_VIRTUAL_SOUNDCARD", matches = "1")
    void aScriptedRunOnTheVirtualSoundCard(@TempDir Path dir) throws Exception {
        Path logFile = dir.resolve("abx.json");
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        CommandLine cl = new CommandLine(new ListenTestCommand(() -> new StringReader(script(5, "xb"))));
        cl.setOut(new PrintWriter(out));
        cl.setErr(new PrintWriter(err));
        int status = cl.execute("presets/bench-pink.json", "ideal-pink", "--trials", "5", "--seed", "3",
                "--log", logFile.toString());
        assertEquals(0, status, err + "\n" + out);
        AbxLog log = AbxLog.fromJson(Files.readString(logFile));
        assertTrue(log.complete());
        assertEquals(3, log.seed());
        List<Side> order = AbxSession.order(5, 3);
        int correct = 0;
        for (int i = 0; i < 5; i++) {
            assertEquals(order.get(i), log.log().get(i).x());
            correct += order.get(i) == Side.B ? 1 : 0;
        }
        assertTrue(out.toString().contains(Numbers.f("Correct: %d of 5.", correct)), out.toString());
        assertTrue(out.toString().contains("Caution: noise can damage hearing"), out.toString());
    }
}
