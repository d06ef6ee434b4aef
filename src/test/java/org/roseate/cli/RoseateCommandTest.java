package org.roseate.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import picocli.CommandLine;

/**
 * The start-up shortcut of {@link RoseateCommand#run(PrintWriter, PrintWriter, boolean, String...)}: a
 * command line that starts with a verb builds the model of that verb alone. The checks compare it with
 * the whole model built from the annotations, the reference here.
 */
class RoseateCommandTest {
    private record Run(int status, String out, String err) {
    }

    private static Run run(boolean oneVerb, String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int status = RoseateCommand.run(new PrintWriter(out), new PrintWriter(err), oneVerb, args);
        return new Run(status, out.toString(), err.toString());
    }

    private static Map<String, CommandLine> wholeModel() {
        return new CommandLine(new RoseateCommand()).getSubcommands();
    }

    @Test
    void everyVerbOfTheAnnotationHasItsClassInTheShortcutTable() {
        for (Map.Entry<String, CommandLine> e : wholeModel().entrySet()) {
            Class<?> declared = e.getValue().getCommandSpec().userObject().getClass();
            if (e.getKey().equals("help")) {
                assertNull(RoseateCommand.verbClass("help"), "help needs the list of verbs: whole model");
            } else {
                assertEquals(declared, RoseateCommand.verbClass(e.getKey()), e.getKey());
            }
        }
        assertNull(RoseateCommand.verbClass("analyse"), "a misspelt verb gets the whole model (its suggestions)");
    }

    @Test
    void helpVersionAndBadOptionsPrintTheSameThroughEitherModel() {
        for (String verb : wholeModel().keySet()) {
            if (verb.equals("help")) {
                continue;
            }
            for (List<String> tail : List.of(List.of("--help"), List.of("-V"), List.of("--no-such-option"))) {
                String[] args = new String[tail.size() + 1];
                args[0] = verb;
                for (int i = 0; i < tail.size(); i++) {
                    args[i + 1] = tail.get(i);
                }
                Run whole = run(false, args);
                Run one = run(true, args);
                String what = String.join(" ", args);
                assertEquals(whole.status(), one.status(), what);
                assertEquals(whole.out(), one.out(), what);
                assertEquals(whole.err(), one.err(), what);
            }
        }
    }

    @Test
    void analyzeOfAPresetPrintsTheSameThroughEitherModel() {
        for (String format : List.of("table", "json", "csv")) {
            Run whole = run(false, "analyze", "presets/bench-pink.json", "--format", format);
            Run one = run(true, "analyze", "presets/bench-pink.json", "--format", format);
            assertEquals(0, one.status(), one.err());
            assertEquals(whole.out(), one.out(), format);
            assertEquals(whole.err(), one.err(), format);
        }
    }
}
