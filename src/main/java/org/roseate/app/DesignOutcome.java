package org.roseate.app;

import java.util.Optional;
import org.roseate.circuit.Design;
import org.roseate.circuit.DesignException;
import org.roseate.circuit.DesignReader;
import org.roseate.model.CircuitModel;

/**
 * The result of reading and analysing one version of the design text: a model and its curves, or
 * the design error and where it points. Immutable; built on a background thread.
 *
 * @param text         the text that was read
 * @param model        the circuit model, or null on error
 * @param curves       its curves, or null on error
 * @param error        the one-line error, or null
 * @param errorSpan    where in the text the error points, if known
 * @param elapsedNanos time taken to read, model and analyse
 */
record DesignOutcome(String text, CircuitModel model, DesignCurves curves, DesignException error,
        Optional<TextSpan> errorSpan, long elapsedNanos) {

    boolean ok() {
        return error == null;
    }

    Design design() {
        return model == null ? null : model.design();
    }

    /** Reads the text with {@link DesignReader#parse}, builds the {@link CircuitModel} and the curves. */
    static DesignOutcome of(String text, String source, AnalysisSettings settings) {
        long t0 = System.nanoTime();
        try {
            Design d = DesignReader.parse(text, source);
            CircuitModel m = CircuitModel.of(d, source);
            DesignCurves c = DesignCurves.of(m, settings);
            return new DesignOutcome(text, m, c, null, Optional.empty(), System.nanoTime() - t0);
        } catch (DesignException e) {
            return new DesignOutcome(text, null, null, e, ErrorLocator.locate(text, e), System.nanoTime() - t0);
        } catch (RuntimeException e) {
            DesignException d = new DesignException(source + ": cannot analyse the design (" + e.getMessage() + ")");
            return new DesignOutcome(text, null, null, d, Optional.empty(), System.nanoTime() - t0);
        }
    }

    /** Analyses a design already read (after a value step), with its text from {@link org.roseate.circuit.DesignWriter}. */
    static DesignOutcome of(Design design, String text, String source, AnalysisSettings settings) {
        long t0 = System.nanoTime();
        try {
            CircuitModel m = CircuitModel.of(design, source);
            return new DesignOutcome(text, m, DesignCurves.of(m, settings), null, Optional.empty(), System.nanoTime() - t0);
        } catch (DesignException e) {
            return new DesignOutcome(text, null, null, e, ErrorLocator.locate(text, e), System.nanoTime() - t0);
        }
    }
}
