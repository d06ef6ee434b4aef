package org.roseate.circuit;

import java.util.OptionalInt;

/**
 * A design file or design text that cannot be used. The message is one line that names the
 * source, the place and what was expected, e.g.
 * {@code bench.json: stage 1 feedback, column 23: expected a value such as 4k7 or 22n, found '4kk7'}.
 * For network errors the stage (1-based), role and column are also available for editors.
 */
public final class DesignException extends RuntimeException {
    private final int stageNumber;
    private final String role;
    private final int column;

    public DesignException(String message) {
        this(message, 0, null, 0);
    }

    public DesignException(String message, int stageNumber, String role, int column) {
        super(message);
        this.stageNumber = stageNumber;
        this.role = role;
        this.column = column;
    }

    /** 1-based stage number, or empty when the error is not inside a stage. */
    public OptionalInt stageNumber() {
        return stageNumber > 0 ? OptionalInt.of(stageNumber) : OptionalInt.empty();
    }

    /** The network role ({@code feedback}, {@code input} …) or null. */
    public String role() {
        return role;
    }

    /** 1-based column inside the network expression, or empty. */
    public OptionalInt column() {
        return column > 0 ? OptionalInt.of(column) : OptionalInt.empty();
    }
}
