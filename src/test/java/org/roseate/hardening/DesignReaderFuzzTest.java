package org.roseate.hardening;

import com.code_intelligence.jazzer.api.FuzzedDataProvider;
import com.code_intelligence.jazzer.junit.FuzzTest;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.roseate.circuit.Design;
import org.roseate.circuit.DesignException;
import org.roseate.circuit.DesignReader;
import org.roseate.model.CircuitModel;

/**
 * Fuzzing of the design-file reader (Jazzer). Contract: any text gives a {@link Design} or a
 * {@link DesignException} whose message is one line starting with the source name; nothing else
 * escapes, nothing hangs (per-input timeout) and memory stays bounded (the surefire heap).
 *
 * <p>Without {@code JAZZER_FUZZ} (plain {@code mvn verify}) each method runs only its seed corpus
 * under {@code src/test/resources/org/roseate/hardening/DesignReaderFuzzTestInputs/<method>/}, in
 * well under a second. How to fuzz for real: {@code src/test/bench/RESULTS.md}.
 */
class DesignReaderFuzzTest {
    private static final String SOURCE = "fuzz.json";
    private static final List<String> PRESETS = loadPresets();

    /** Arbitrary bytes, read as UTF-8 (malformed sequences become U+FFFD), through parse and the model. */
    @FuzzTest(maxDuration = "5m")
    void arbitraryText(byte[] input) throws Throwable {
        String text = new String(input, StandardCharsets.UTF_8);
        Bounded.run(() -> check(text));
    }

    /**
     * A bundled preset with structured edits: a network string or value replaced by fuzzed text,
     * keys renamed, stages duplicated or nested, characters spliced in, the text cut.
     */
    @FuzzTest(maxDuration = "5m")
    void mutatedPreset(FuzzedDataProvider data) throws Throwable {
        String mutated = mutate(data);
        Bounded.run(() -> check(mutated));
    }

    /** The structured mutation of {@link #mutatedPreset}, for replaying a finding by hand. */
    static String mutate(FuzzedDataProvider data) {
        StringBuilder text = new StringBuilder(PRESETS.get(data.consumeInt(0, PRESETS.size() - 1)));
        int edits = data.consumeInt(1, 6);
        for (int e = 0; e < edits && text.length() > 0; e++) {
            switch (data.consumeInt(0, 7)) {
                case 0 -> replaceQuoted(text, data, data.consumeString(40));
                case 1 -> replaceQuoted(text, data, nestedNetwork(data));
                case 2 -> replaceQuoted(text, data, valueLike(data));
                case 3 -> {
                    int at = data.consumeInt(0, text.length());
                    text.insert(at, data.consumeString(8));
                }
                case 4 -> text.setLength(data.consumeInt(0, text.length()));
                case 5 -> duplicateStage(text, data.consumeInt(1, 40));
                case 6 -> {
                    int at = data.consumeInt(0, text.length() - 1);
                    text.setCharAt(at, data.pickValue(new Character[] {'{', '}', '[', ']', '"', ',', ':', '(', ')', '|', '+', '\n', '\\'}));
                }
                default -> replaceQuoted(text, data, data.pickValue(new String[] {
                    "kind", "inverting", "noninverting", "divider", "input", "feedback", "ground", "series", "shunt",
                    "load", "opamp", "gbwHz", "openLoopGain", "tolerance", "stages", "name", "R", "C", "L", "R1", "1%",
                    "-5%", "NaN", "1e309", "0", ""}));
            }
        }
        return text.toString();
    }

    static void check(String text) {
        Design design;
        try {
            design = DesignReader.parse(text, SOURCE);
        } catch (DesignException e) {
            Contract.oneLine(e.getMessage(), SOURCE + ": ", e);
            return;
        }
        // A design that reads must also build its model (what analyze and render do next), or
        // fail with the same kind of message.
        try {
            CircuitModel model = CircuitModel.of(design, SOURCE);
            model.zpk();
            model.response(1000.0);
        } catch (DesignException e) {
            Contract.oneLine(e.getMessage(), SOURCE + ": ", e);
        }
    }

    /** Replaces the content of the k-th quoted string (k fuzzed) with {@code replacement}, JSON-escaped. */
    private static void replaceQuoted(StringBuilder text, FuzzedDataProvider data, String replacement) {
        int quotes = 0;
        for (int i = 0; i < text.length(); i++) {
            if (text.charAt(i) == '"') {
                quotes++;
            }
        }
        if (quotes < 2) {
            return;
        }
        int k = data.consumeInt(0, quotes / 2 - 1);
        int seen = 0;
        int open = -1;
        for (int i = 0; i < text.length(); i++) {
            if (text.charAt(i) == '"' && (i == 0 || text.charAt(i - 1) != '\\')) {
                if (seen == 2 * k) {
                    open = i;
                } else if (seen == 2 * k + 1) {
                    text.replace(open + 1, i, escape(replacement));
                    return;
                }
                seen++;
            }
        }
    }

    private static String escape(String s) {
        StringBuilder b = new StringBuilder();
        for (int i = 0; i < s.length(); i++) {
            char c = s.charAt(i);
            if (c == '"' || c == '\\') {
                b.append('\\').append(c);
            } else if (c < 0x20) {
                b.append(String.format("\\u%04x", (int) c));
            } else {
                b.append(c);
            }
        }
        return b.toString();
    }

    /** A network expression with fuzzed depth, width, operators and values. */
    private static String nestedNetwork(FuzzedDataProvider data) {
        int depth = data.consumeInt(0, 3000);
        int width = data.consumeInt(1, 300);
        String op = data.consumeBoolean() ? " || " : " + ";
        StringBuilder b = new StringBuilder();
        b.append("(".repeat(depth));
        for (int i = 0; i < width; i++) {
            if (i > 0) {
                b.append(op);
            }
            char kind = data.pickValue(new Character[] {'R', 'C', 'L'});
            b.append(kind).append(i + 1).append('(').append(valueLike(data)).append(')');
        }
        b.append(")".repeat(data.consumeBoolean() ? depth : data.consumeInt(0, depth + 2)));
        return b.toString();
    }

    /** Something close to a component value: digits, letters of the IEC 60062 code, exponents, units. */
    private static String valueLike(FuzzedDataProvider data) {
        return data.pickValue(new String[] {"4k7", "10k", "1n", "22n", "R47", "1e3", "1e-300", "1e300", "0", "-1",
            "4.7e-9F", "47kΩ", "10mH", "1p", "999G", "1e-320", "Infinity", "0x10", "4kk7", "1m5"})
                + (data.consumeBoolean() ? data.consumeString(3) : "");
    }

    /**
     * Repeats the stage list. Copies stop at {@link DesignReader#MAX_FILE_BYTES}, the limit that
     * {@code read} puts on files: without it a few repeated edits grew the text exponentially
     * (finding timeout-3af9b32e…, 2.4 MB from 20 bytes of fuzz data), which measured the harness, not the reader.
     */
    private static void duplicateStage(StringBuilder text, int copies) {
        int open = text.indexOf("[");
        int close = text.lastIndexOf("]");
        if (open < 0 || close <= open) {
            return;
        }
        String stages = text.substring(open + 1, close);
        copies = (int) Math.min(copies, (DesignReader.MAX_FILE_BYTES - text.length()) / (stages.length() + 1));
        StringBuilder b = new StringBuilder(stages);
        for (int i = 0; i < copies; i++) {
            b.append(',').append(stages);
        }
        text.replace(open + 1, close, b.toString());
    }

    private static List<String> loadPresets() {
        try (var files = Files.list(Path.of("presets"))) {
            List<String> texts = files.filter(p -> p.toString().endsWith(".json")).sorted()
                    .map(DesignReaderFuzzTest::readString).toList();
            if (texts.isEmpty()) {
                throw new IllegalStateException("no presets found under " + Path.of("presets").toAbsolutePath());
            }
            return texts;
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    private static String readString(Path p) {
        try {
            return Files.readString(p);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}
