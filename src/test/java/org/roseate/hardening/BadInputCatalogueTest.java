package org.roseate.hardening;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;
import org.roseate.cli.RoseateCommand;

/**
 * The bad-input catalogue: every row runs the real command line ({@link RoseateCommand#run(PrintWriter,
 * PrintWriter, String...)}) on one kind of bad input and checks the exit status (README: 2 for bad
 * input, 3 for device trouble) and that stderr is one line starting with "roseate: " with no stack
 * trace. Argument errors caught by the option parser add the documented second line
 * "Try 'roseate … --help' for the options." (DEVELOPERS.md, bad-input table), and nothing else.
 *
 * <p>The same table produces {@code src/test/bench/BAD-INPUTS.md}; {@link #catalogueFileIsCurrent()}
 * fails when the committed file differs, and {@code -Droseate.writeCatalogue=true} rewrites it.
 */
class BadInputCatalogueTest {
    private static final Path CATALOGUE = Path.of("src/test/bench/BAD-INPUTS.md");
    private static final String HELP_POINTER = "^Try 'roseate ([a-z]+ )*--help' for the options\\.$";
    private static final String STAGE = "{\"name\": \"n\", \"stages\": [{\"kind\": \"inverting\", \"input\": \"R1(10k)\", \"feedback\": \"%s\"}]}";

    @TempDir
    static Path dir;

    /**
     * One bad input. {@code args} may name files in the temp folder by their bare name (a leading
     * '@' marks them); {@code expect} is a fragment the message must contain after "roseate: ".
     */
    record Row(String group, String input, List<String> args, int status, boolean usage, String expect) {
        @Override
        public String toString() {
            return group + ": " + input;
        }
    }

    private static final List<Row> ROWS = new ArrayList<>();

    private static void row(String group, String input, int status, boolean usage, String expect, String... args) {
        ROWS.add(new Row(group, input, List.of(args), status, usage, expect));
    }

    static {
        // design files
        row("design file", "invalid JSON", 2, false, "bad-json.json: invalid JSON at line 1", "analyze", "@bad-json.json");
        row("design file", "empty file", 2, false, "empty.json: empty file", "analyze", "@empty.json");
        row("design file", "not an object", 2, false, "list.json: expected a JSON object", "analyze", "@list.json");
        row("design file", "unknown stage kind", 2, false, "kind.json: stage 1: unknown kind 'bandpass'", "analyze", "@kind.json");
        row("design file", "missing key", 2, false, "missing.json: stage 1 (inverting): missing key 'feedback'", "analyze", "@missing.json");
        row("design file", "unknown key", 2, false, "unknown.json: stage 1 (inverting): unknown key 'feedbak'", "analyze", "@unknown.json");
        row("design file", "no stages", 2, false, "nostages.json: 'stages' is empty", "analyze", "@nostages.json");
        row("design file", "unknown designator letter", 2, false, "letter.json: stage 1 feedback, column 1: unknown designator letter 'Q'", "analyze", "@letter.json");
        row("design file", "unbalanced parentheses", 2, false, "parens.json: stage 1 feedback, column 1: unbalanced parentheses", "analyze", "@parens.json");
        row("design file", "parentheses nested too deep", 2, false, "deep.json: stage 1 feedback, column 101: parentheses nested deeper than 100 levels", "analyze", "@deep.json");
        row("design file", "mixed + and ||", 2, false, "mixed.json: stage 1 feedback, column 19: '+' and '||' mixed without parentheses", "analyze", "@mixed.json");
        row("design file", "empty network", 2, false, "emptynet.json: stage 1 feedback, column 1: empty network", "analyze", "@emptynet.json");
        row("design file", "designator used twice", 2, false, "twice.json: designator R1 is used twice", "analyze", "@twice.json");
        row("design file", "short-circuit network", 2, false, "short.json: stage 1 input: it is a short circuit at every frequency", "analyze", "@short.json");
        row("design file", "line break inside a quoted name", 2, false, "newline.json: stage 1: unknown kind 'a\\nb'", "analyze", "@newline.json");
        row("design file", "missing file", 2, false, "nope.json: no such file", "analyze", "@nope.json");
        row("design file", "a folder", 2, false, "folder.json: is a folder", "analyze", "@folder.json");
        row("design file", "not UTF-8", 2, false, "latin1.json: not UTF-8 text", "analyze", "@latin1.json");
        // values
        row("value", "bad value 4kk7", 2, false, "value.json: stage 1 feedback, column 4: expected a value such as 4k7 or 22n, found '4kk7'", "analyze", "@value.json");
        row("value", "zero value", 2, false, "zero.json: stage 1 feedback, column 4:", "analyze", "@zero.json");
        row("value", "negative value", 2, false, "negative.json: stage 1 feedback, column 4:", "analyze", "@negative.json");
        row("value", "unit that does not fit the part (22nH on a capacitor)", 2, false, "unit.json: stage 1 feedback, column 4:", "analyze", "@unit.json");
        row("value", "op-amp gbwHz not positive", 2, false, "gbw.json: stage 1 opamp gbwHz: must be a finite number > 0, found -1", "analyze", "@gbw.json");
        row("value", "bad tolerance", 2, false, "tol.json: tolerance R:", "analyze", "@tol.json");
        // WAV files (measure)
        row("WAV file", "empty file", 2, false, "empty.wav: empty file (0 bytes), not a WAV file", "measure", "@empty.wav");
        row("WAV file", "not RIFF", 2, false, "text.wav: not a WAV file (no RIFF header)", "measure", "@text.wav");
        row("WAV file", "truncated data chunk", 2, false, "truncated.wav: truncated: data chunk says", "measure", "@truncated.wav");
        row("WAV file", "unsupported encoding (format tag 2, ADPCM)", 2, false, "adpcm.wav: unsupported encoding (format tag 2", "measure", "@adpcm.wav");
        row("WAV file", "channel out of range", 2, false, "ok.wav: --channel 3 is out of range; the file has 1", "measure", "@ok.wav", "--channel", "3");
        row("WAV file", "missing file", 2, false, "nope.wav: no such file", "measure", "@nope.wav");
        // command-line arguments
        row("argument", "render --rate 12345", 2, false, "--rate: expected 44100, 48000, 96000 or 192000, found 12345", "render", "@good.json", "-o", "@r1.wav", "--rate", "12345");
        row("argument", "render --bits 20", 2, false, "--bits: expected 16, 24 or 32f, found '20'", "render", "@good.json", "-o", "@r2.wav", "--bits", "20");
        row("argument", "render --level 3", 2, false, "--level: expected an RMS level from -120 to 0 dBFS, found 3.0", "render", "@good.json", "-o", "@r3.wav", "--level", "3");
        row("argument", "render --level loud", 2, true, "Invalid value for option '--level'", "render", "@good.json", "-o", "@r4.wav", "--level", "loud");
        row("argument", "render --seconds 0", 2, false, "--seconds: expected a duration from 0 to 86400 s, found 0.0", "render", "@good.json", "-o", "@r5.wav", "--seconds", "0");
        row("argument", "render to an existing file without --force", 2, false, "exists.wav", "render", "@good.json", "-o", "@exists.wav", "--seconds", "0.1");
        row("argument", "render -o out.mp3", 2, false, "-o out.mp3: expected a .wav file", "render", "@good.json", "-o", "@out.mp3");
        row("argument", "analyze --range 20k-20", 2, false, "--range:", "analyze", "@good.json", "--range", "20k-20");
        row("argument", "analyze --range abc", 2, false, "--range:", "analyze", "@good.json", "--range", "abc");
        row("argument", "analyze --bands fifth", 2, false, "--bands: expected octave or third, found 'fifth'", "analyze", "@good.json", "--bands", "fifth");
        row("argument", "unknown option", 2, true, "Unknown option: '--bogus'", "analyze", "@good.json", "--bogus");
        row("argument", "missing design file argument", 2, true, "Missing required parameter", "analyze");
        row("argument", "unknown subcommand", 2, true, "Unmatched argument at index 0: 'frobnicate'", "frobnicate");
        // devices
        row("device", "play --device that does not exist", 3, false, "no audio output device", "play", "--source", "white", "--seconds", "1", "--device", "nosuch-device");
    }

    @BeforeAll
    static void writeInputs() throws IOException {
        design("good.json", String.format(STAGE, "R2(100k) || C1(10n)"));
        write("bad-json.json", "{\"name\": \"n\", \"stages\": [");
        write("empty.json", "");
        write("list.json", "[1, 2]");
        write("kind.json", "{\"name\": \"n\", \"stages\": [{\"kind\": \"bandpass\"}]}");
        write("missing.json", "{\"name\": \"n\", \"stages\": [{\"kind\": \"inverting\", \"input\": \"R1(10k)\"}]}");
        write("unknown.json", "{\"name\": \"n\", \"stages\": [{\"kind\": \"inverting\", \"input\": \"R1(10k)\", \"feedbak\": \"R2(1k)\"}]}");
        write("nostages.json", "{\"name\": \"n\", \"stages\": []}");
        design("letter.json", String.format(STAGE, "Q1(10k)"));
        design("parens.json", String.format(STAGE, "(R2(10k) || C1(1n)"));
        design("deep.json", String.format(STAGE, "(".repeat(101) + "R2(1k)" + ")".repeat(101)));
        design("mixed.json", String.format(STAGE, "R2(10k) || C1(1n) + R3(1k)"));
        design("emptynet.json", String.format(STAGE, " "));
        design("twice.json", String.format(STAGE, "R1(10k) || C1(1n)"));
        write("short.json", "{\"name\": \"n\", \"stages\": [{\"kind\": \"inverting\", \"input\": \"R1(1e-200) || R2(1e-200)\", \"feedback\": \"R3(10k)\"}]}");
        write("newline.json", "{\"name\": \"n\", \"stages\": [{\"kind\": \"a\\nb\"}]}");
        Files.createDirectory(dir.resolve("folder.json"));
        Files.write(dir.resolve("latin1.json"), "{\"name\": \"caf\u00e9\"}".getBytes(StandardCharsets.ISO_8859_1));
        design("value.json", String.format(STAGE, "R2(4kk7)"));
        design("zero.json", String.format(STAGE, "R2(0)"));
        design("negative.json", String.format(STAGE, "R2(-1k)"));
        design("unit.json", String.format(STAGE, "C1(22nH)"));
        write("gbw.json", "{\"name\": \"n\", \"stages\": [{\"kind\": \"inverting\", \"input\": \"R1(10k)\", \"feedback\": \"R2(1k)\", \"opamp\": {\"gbwHz\": -1}}]}");
        write("tol.json", "{\"name\": \"n\", \"tolerance\": {\"R\": \"lots\"}, \"stages\": [{\"kind\": \"inverting\", \"input\": \"R1(10k)\", \"feedback\": \"R2(1k)\"}]}");
        Files.write(dir.resolve("empty.wav"), new byte[0]);
        write("text.wav", "this is not audio\n");
        byte[] ok = wav(1, 1, 16, 48000, 48000);
        Files.write(dir.resolve("ok.wav"), ok);
        Files.write(dir.resolve("truncated.wav"), java.util.Arrays.copyOf(ok, 1000));
        Files.write(dir.resolve("adpcm.wav"), wav(2, 1, 4, 48000, 4800));
        Files.write(dir.resolve("exists.wav"), "old content".getBytes(StandardCharsets.US_ASCII));
    }

    private static void design(String name, String text) throws IOException {
        write(name, text);
    }

    private static void write(String name, String text) throws IOException {
        Files.writeString(dir.resolve(name), text);
    }

    /** A canonical 44-byte-header WAV (RIFF/WAVE, Microsoft 1991) with {@code frames} frames of a 1 kHz sine. */
    static byte[] wav(int tag, int channels, int bits, int rate, int frames) {
        int bytesPerFrame = Math.max(1, channels * bits / 8);
        int data = frames * bytesPerFrame;
        ByteBuffer b = ByteBuffer.allocate(44 + data).order(ByteOrder.LITTLE_ENDIAN);
        b.put("RIFF".getBytes(StandardCharsets.US_ASCII)).putInt(36 + data).put("WAVE".getBytes(StandardCharsets.US_ASCII));
        b.put("fmt ".getBytes(StandardCharsets.US_ASCII)).putInt(16).putShort((short) tag).putShort((short) channels)
                .putInt(rate).putInt(rate * bytesPerFrame).putShort((short) bytesPerFrame).putShort((short) bits);
        b.put("data".getBytes(StandardCharsets.US_ASCII)).putInt(data);
        if (bits == 16) {
            for (int i = 0; i < frames * channels; i++) {
                b.putShort((short) Math.round(8000 * Math.sin(2 * Math.PI * 1000 * (i / channels) / rate)));
            }
        }
        return b.array();
    }

    static Stream<Row> rows() {
        return ROWS.stream();
    }

    record Result(int status, String out, String err) {
    }

    private static final java.util.Map<Row, Result> RESULTS = new java.util.HashMap<>();

    /** Runs a row once per test class; the table file reuses the results of the row tests. */
    static synchronized Result run(Row row) {
        return RESULTS.computeIfAbsent(row, BadInputCatalogueTest::runNow);
    }

    private static Result runNow(Row row) {
        String[] args = row.args().stream().map(a -> a.startsWith("@") ? dir.resolve(a.substring(1)).toString() : a)
                .toArray(String[]::new);
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int status = RoseateCommand.run(new PrintWriter(out), new PrintWriter(err), args);
        return new Result(status, out.toString(), err.toString());
    }

    /** The message after "roseate: ", with the temp folder removed so the table reads the same everywhere. */
    static String message(Result r) {
        String first = r.err().lines().findFirst().orElse("");
        return first.substring(Math.min(first.length(), "roseate: ".length())).replace(dir + java.io.File.separator, "");
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("rows")
    void badInputGivesOneLineAndTheDocumentedStatus(Row row) throws IOException {
        Result r = run(row);
        assertEquals(row.status(), r.status(), () -> row + "\nstderr: " + r.err());
        List<String> lines = r.err().lines().toList();
        assertFalse(lines.isEmpty(), row + ": nothing on stderr");
        assertTrue(lines.get(0).startsWith("roseate: "), () -> row + ": " + r.err());
        Contract.oneLine(lines.get(0), "roseate: ", null);
        if (row.usage()) {
            assertEquals(2, lines.size(), () -> row + ": " + r.err());
            assertTrue(lines.get(1).matches(HELP_POINTER), () -> row + ": " + lines.get(1));
        } else {
            assertEquals(1, lines.size(), () -> row + ": stderr is not one line:\n" + r.err());
        }
        assertFalse(r.err().contains("\tat ") || r.err().contains("Exception") || r.err().contains("internal error"),
                () -> row + ": stack trace or exception name on stderr:\n" + r.err());
        assertTrue(message(r).contains(row.expect()), () -> row + ": expected '" + row.expect() + "' in: " + message(r));
        if (row.input().contains("existing file")) {
            assertEquals("old content", Files.readString(dir.resolve("exists.wav")), "the old file must be untouched");
        }
    }

    /** The committed BAD-INPUTS.md is exactly what this table produces now. */
    @Test
    void catalogueFileIsCurrent() throws IOException {
        String table = markdown();
        if (Boolean.getBoolean("roseate.writeCatalogue")) {
            Files.writeString(CATALOGUE, table);
        }
        assertEquals(table, Files.exists(CATALOGUE) ? Files.readString(CATALOGUE) : "",
                "src/test/bench/BAD-INPUTS.md is stale; regenerate it with "
                        + "mvn -q test -Dtest=BadInputCatalogueTest -Droseate.writeCatalogue=true");
    }

    static String markdown() {
        StringBuilder b = new StringBuilder();
        b.append("## Bad input and the message it gets\n\n");
        b.append("Generated by `BadInputCatalogueTest` (`mvn -q test -Dtest=BadInputCatalogueTest -Droseate.writeCatalogue=true`);\n");
        b.append("each row is run through the real command line and checked: exit status, one line on stderr starting\n");
        b.append("with `roseate: `, no stack trace. Rows marked † also print the pointer `Try 'roseate … --help' for the options.`\n\n");
        b.append("| kind | input | command | status | message (after `roseate: `) |\n|---|---|---|---|---|\n");
        for (Row row : ROWS) {
            Result r = run(row);
            String cmd = String.join(" ", row.args().stream().map(a -> a.startsWith("@") ? a.substring(1) : a).toList());
            b.append("| ").append(row.group()).append(" | ").append(cell(row.input())).append(row.usage() ? " †" : "")
                    .append(" | `roseate ").append(cell(cmd)).append("` | ").append(r.status()).append(" | ")
                    .append(row.group().equals("device") ? "`" + cell(DEVICE_DOC) + "`" : code(cell(message(r)))).append(" |\n");
        }
        return b.toString();
    }

    /**
     * The device row's message depends on the machine (a machine without any output device says so
     * instead of naming the missing one), so the file shows both forms rather than this machine's.
     */
    private static final String DEVICE_DOC = "no audio output device named 'nosuch-device'; list the devices with "
            + "'roseate devices', or write a file instead with 'roseate render DESIGN.json -o out.wav'` (on a machine "
            + "with no output device at all: `no audio output device found (Java Sound lists none); …";

    private static String cell(String s) {
        return s.replace("|", "\\|");
    }

    /** A code span that survives backticks inside the text (CommonMark: a longer fence and spaces). */
    private static String code(String s) {
        return s.contains("`") ? "`` " + s + " ``" : "`" + s + "`";
    }
}
