package org.roseate.measure;

/**
 * A capture or a request the pipeline refuses, with a one-line message a user can act on (it names
 * the source where there is one). The command line prints it after {@code roseate: } and exits with
 * status 2; the window shows it.
 */
public final class MeasureException extends RuntimeException {
    private static final long serialVersionUID = 1L;

    public MeasureException(String message) {
        super(message);
    }
}
