package org.roseate.app;

import java.util.Locale;

/** Number text for the tool views: '.' decimal point whatever the locale, as the CLI prints. */
final class ToolText {
    private ToolText() {
    }

    static String f(String pattern, Object... args) {
        return String.format(Locale.ROOT, pattern, args);
    }

    /** A frequency for humans: 19.95 Hz, 1.000 kHz (four significant digits). */
    static String hz(double hz) {
        return hz >= 1000 ? f("%.4g kHz", hz / 1000) : f("%.4g Hz", hz);
    }

    /** Volts to four significant digits, as {@code budget} prints them. */
    static String volts(double v) {
        return f("%.4g", v);
    }
}
