package org.roseate.cli;

import java.io.PrintWriter;

/**
 * A terminal progress bar on stderr for long work: silent for the first two seconds (short runs
 * print nothing), then redrawn at most four times a second, and only when a console is attached.
 */
final class Progress {
    private static final long QUIET_NANOS = 2_000_000_000L;
    private static final long REDRAW_NANOS = 250_000_000L;
    private final PrintWriter err;
    private final String label;
    private final long start = System.nanoTime();
    private final boolean enabled;
    private long lastDraw;
    private boolean drawn;

    Progress(PrintWriter err, String label) {
        this.err = err;
        this.label = label;
        this.enabled = System.console() != null;
    }

    /** @param fraction done, 0..1 */
    void update(double fraction) {
        if (!enabled) {
            return;
        }
        long now = System.nanoTime();
        if (now - start < QUIET_NANOS || now - lastDraw < REDRAW_NANOS) {
            return;
        }
        lastDraw = now;
        drawn = true;
        int width = 30;
        int filled = (int) Math.round(Math.max(0, Math.min(1, fraction)) * width);
        double elapsed = (now - start) / 1e9;
        double eta = fraction > 0 ? elapsed * (1 - fraction) / fraction : 0;
        err.print(Numbers.f("\r%s [%s%s] %3.0f%%  %.0f s left ", label, "#".repeat(filled), ".".repeat(width - filled),
                100 * fraction, eta));
        err.flush();
    }

    void done() {
        if (drawn) {
            err.print("\r" + " ".repeat(label.length() + 52) + "\r");
            err.flush();
        }
    }
}
