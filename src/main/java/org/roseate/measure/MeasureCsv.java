package org.roseate.measure;

import java.io.IOException;
import java.io.StringWriter;
import java.io.UncheckedIOException;
import java.util.ArrayList;
import java.util.List;
import org.roseate.io.CsvWriter;

/**
 * The CSV form of a result (RFC 4180 through {@link CsvWriter}: CRLF line ends, numbers in Java's
 * shortest round-trip form, empty fields for values that do not exist). Noise-source mode: one row
 * per band; transfer mode: one row per response point. The command line's {@code --format csv} and
 * the window's "Export CSV" both print this, byte for byte.
 */
public final class MeasureCsv {
    private MeasureCsv() {
    }

    /** The CSV text for the result's mode. */
    public static String of(MeasureResult r) {
        return r.mode() == MeasureMode.TRANSFER ? response(r) : bands(r);
    }

    /**
     * Band rows: nominalHz, lowHz, highHz, db, uncertaintyDb, deviationDb, normalizedDb,
     * [designDifferenceDb,] [coherence, trusted,] tone, complete, counted, belowCalibrationCorner.
     */
    public static String bands(MeasureResult r) {
        boolean design = r.hasDesign();
        boolean transfer = r.mode() == MeasureMode.TRANSFER;
        List<String> header = new ArrayList<>(List.of("nominalHz", "lowHz", "highHz", "db", "uncertaintyDb", "deviationDb",
                "normalizedDb"));
        if (design) {
            header.add("designDifferenceDb");
        }
        if (transfer) {
            header.addAll(List.of("coherence", "trusted"));
        }
        header.addAll(List.of("tone", "complete", "counted", "belowCalibrationCorner"));
        try {
            StringWriter sw = new StringWriter();
            CsvWriter w = new CsvWriter(sw, header);
            for (BandResult b : r.bands()) {
                List<Object> row = new ArrayList<>(List.of(b.band().nominalHz(), b.band().lowHz(), b.band().highHz()));
                row.add(num(b.levelDb()));
                row.add(num(b.uncertaintyDb()));
                row.add(num(b.deviationDb()));
                row.add(num(b.normalizedDb()));
                if (design) {
                    row.add(num(b.designDifferenceDb()));
                }
                if (transfer) {
                    row.add(num(b.coherence()));
                    row.add(b.trusted());
                }
                row.add(b.toneDominated());
                row.add(b.complete());
                row.add(b.counted());
                row.add(b.belowCalibrationCorner());
                w.row(row.toArray());
            }
            w.flush();
            return sw.toString();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** Response rows: hz, db, uncertaintyDb, deg, uncertaintyDeg, coherence, trusted, targetDb, modelDb. */
    public static String response(MeasureResult r) {
        try {
            StringWriter sw = new StringWriter();
            CsvWriter w = new CsvWriter(sw, List.of("hz", "db", "uncertaintyDb", "deg", "uncertaintyDeg", "coherence",
                    "trusted", "targetDb", "modelDb"));
            for (ResponsePoint p : r.points()) {
                w.row(p.hz(), num(p.db()), num(p.uncertaintyDb()), num(p.deg()), num(p.uncertaintyDeg()), num(p.coherence()),
                        p.trusted(), num(p.targetDb()), num(p.modelDb()));
            }
            w.flush();
            return sw.toString();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** A number, or null (an empty field) when it is not finite. */
    private static Double num(double v) {
        return Double.isFinite(v) ? v : null;
    }
}
