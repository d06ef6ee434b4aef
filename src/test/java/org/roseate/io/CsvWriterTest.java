package org.roseate.io;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.io.IOException;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** RFC 4180 (Common Format and MIME Type for CSV Files, 2005) §2 rules, and Python's csv module. */
class CsvWriterTest {
    @TempDir
    Path dir;

    @Test
    void quotesOnlyWhereRfc4180RequiresAndDoublesInnerQuotes() {
        // RFC 4180 §2.6: fields with comma, double quote, CR or LF are enclosed in quotes;
        // §2.7: an inner double quote is escaped by another
        assertEquals("plain text", CsvWriter.quote("plain text"));
        assertEquals("\"a,b\"", CsvWriter.quote("a,b"));
        assertEquals("\"say \"\"hi\"\"\"", CsvWriter.quote("say \"hi\""));
        assertEquals("\"two\r\nlines\"", CsvWriter.quote("two\r\nlines"));
        assertEquals("\"lf\n\"", CsvWriter.quote("lf\n"));
        assertEquals("", CsvWriter.quote(""));
    }

    @Test
    void rowsEndInCrlfAndNumbersUseADot() throws IOException {
        StringWriter s = new StringWriter();
        CsvWriter csv = new CsvWriter(s, List.of("bandHz", "levelDb", "note"));
        csv.numberRow(1000.0, -3.0103, 0.25);
        csv.numberRow(31.5, 1.0e-5, Double.NaN);
        csv.row(20000, 2.5f, "R1, 10k \"E96\"");
        csv.row(1L, null, "x");
        csv.flush();
        // RFC 4180 §2.1–2.3: CRLF after each record, header first
        assertEquals("bandHz,levelDb,note\r\n"
                + "1000.0,-3.0103,0.25\r\n"
                + "31.5,1.0E-5,NaN\r\n"
                + "20000,2.5,\"R1, 10k \"\"E96\"\"\"\r\n"
                + "1,,x\r\n", s.toString());
    }

    @Test
    void widthMustMatchTheHeader() throws IOException {
        CsvWriter csv = new CsvWriter(new StringWriter(), List.of("a", "b"));
        assertEquals("row has 3 cells; the header has 2 columns",
                assertThrows(IllegalArgumentException.class, () -> csv.numberRow(1.0, 2.0, 3.0))
                        .getMessage());
        assertThrows(IllegalArgumentException.class,
                () -> new CsvWriter(new StringWriter(), List.of()));
    }

    @Test
    void pythonCsvModuleReadsBackTheSameCellsAndNumbers()
            throws IOException, InterruptedException {
        Path file = dir.resolve("t.csv");
        double[] values = {0.1, -2.5e-300, 1.0 / 3.0, 6.02214076e23};
        StringWriter s = new StringWriter();
        CsvWriter csv = new CsvWriter(s, List.of("name", "value"));
        String[] names = {"comma, inside", "quote \" inside", "line\nbreak", "plain"};
        for (int i = 0; i < values.length; i++) {
            csv.row(names[i], values[i]);
        }
        AtomicOutput.writeString(file, s.toString(), false);
        // reference: Python 3.11 csv.reader (default dialect) and float() parsing
        String script = String.join("\n",
                "import csv, sys",
                "rows = list(csv.reader(open(sys.argv[1], newline='')))",
                "print(repr(rows[0]))",
                "for name, v in rows[1:]: print(repr(name) + '|' + repr(float(v)))");
        List<String> out = WavExternalReadersTest.runPython(
                List.of("python3", "-c", script, file.toString()));
        assertEquals("['name', 'value']", out.get(0));
        String[] reprs = {"'comma, inside'", "'quote \" inside'", "'line\\nbreak'", "'plain'"};
        for (int i = 0; i < values.length; i++) {
            String[] f = out.get(1 + i).split("\\|");
            assertEquals(reprs[i], f[0], out.get(1 + i));
            assertEquals(values[i], Double.parseDouble(f[1]), 0.0, "exact round trip");
        }
        assertEquals(Files.readString(file), s.toString());
    }
}
