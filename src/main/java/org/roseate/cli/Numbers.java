package org.roseate.cli;

import java.util.Locale;

/** Number formatting for tables and CSV: '.' decimal point whatever the locale. */
final class Numbers {
    private Numbers() {
    }

    static String f(String pattern, Object... args) {
        return String.format(Locale.ROOT, pattern, args);
    }

    /** A frequency for humans: 19.95 Hz, 1.000 kHz. */
    static String hz(double hz) {
        if (hz >= 1000) {
            return f("%.4g kHz", hz / 1000);
        }
        return f("%.4g Hz", hz);
    }

    /** Plain shortest round-trip text for CSV and JSON-like output. */
    static String plain(double v) {
        return Double.isNaN(v) ? "" : Double.toString(v);
    }
}
