package org.roseate.io;

import java.io.Flushable;
import java.io.IOException;
import java.io.Writer;
import java.util.List;
import java.util.Objects;

/**
 * Writes a comma-separated table per RFC 4180: a header row, then rows of the same width, each
 * ended by CRLF; a text field is enclosed in double quotes when it holds a comma, a double quote,
 * CR or LF, with inner quotes doubled.
 *
 * <p>Numbers never depend on the locale: a double is written with '.' as decimal separator in the
 * shortest form that reads back to the same value ({@link Double#toString(double)}, e.g. "0.25",
 * "1.0E-5"), NaN as "NaN" and infinities as "Infinity" / "-Infinity" (all accepted by Python's
 * float() and numpy). Integral types are written as integers.
 *
 * <p>The writer does not close its {@link Writer}; use {@link #flush()} when done. Not
 * thread-safe.
 */
public final class CsvWriter implements Flushable {
    private static final String EOL = "\r\n";

    private final Writer out;
    private final int columns;

    /**
     * Writes the header row now.
     *
     * @param out    receives the text
     * @param header column names, at least one
     * @throws IllegalArgumentException if the header is empty
     */
    public CsvWriter(Writer out, List<String> header) throws IOException {
        this.out = Objects.requireNonNull(out, "out");
        if (header.isEmpty()) {
            throw new IllegalArgumentException("header=[] must name at least one column");
        }
        this.columns = header.size();
        row(header.toArray());
    }

    /** The number of columns every row must have. */
    public int columns() {
        return columns;
    }

    /**
     * Writes a row of numbers.
     *
     * @throws IllegalArgumentException if the row's width differs from the header's
     */
    public void numberRow(double... values) throws IOException {
        checkWidth(values.length);
        for (int i = 0; i < values.length; i++) {
            if (i > 0) {
                out.write(',');
            }
            out.write(Double.toString(values[i]));
        }
        out.write(EOL);
    }

    /**
     * Writes a row of mixed cells: {@link Number}s as numbers (see class notes), null as an empty
     * field, anything else as quoted-when-needed text of its toString().
     *
     * @throws IllegalArgumentException if the row's width differs from the header's
     */
    public void row(Object... cells) throws IOException {
        checkWidth(cells.length);
        for (int i = 0; i < cells.length; i++) {
            if (i > 0) {
                out.write(',');
            }
            out.write(cell(cells[i]));
        }
        out.write(EOL);
    }

    private static String cell(Object c) {
        if (c == null) {
            return "";
        }
        if (c instanceof Double d) {
            return Double.toString(d);
        }
        if (c instanceof Float f) {
            return Float.toString(f);
        }
        if (c instanceof Long || c instanceof Integer || c instanceof Short || c instanceof Byte) {
            return Long.toString(((Number) c).longValue());
        }
        return quote(c.toString());
    }

    /** A text field as RFC 4180 wants it: quoted, inner quotes doubled, only when necessary. */
    public static String quote(String text) {
        boolean needs = false;
        for (int i = 0; i < text.length() && !needs; i++) {
            char ch = text.charAt(i);
            needs = ch == ',' || ch == '"' || ch == '\r' || ch == '\n';
        }
        return needs ? '"' + text.replace("\"", "\"\"") + '"' : text;
    }

    private void checkWidth(int n) {
        if (n != columns) {
            throw new IllegalArgumentException("row has " + n + " cells; the header has "
                    + columns + " columns");
        }
    }

    /** Flushes the underlying writer. */
    @Override
    public void flush() throws IOException {
        out.flush();
    }
}
