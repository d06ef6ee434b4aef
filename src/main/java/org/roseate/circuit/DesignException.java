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
        super(oneLine(message));
        this.stageNumber = stageNumber;
        this.role = role;
        this.column = column;
    }

    /**
     * The message with line breaks and other control characters written as escapes ({@code \n},
     * {@code \r}, {@code \t}, {@code \}{@code uXXXX}), so text quoted from a file can never break the
     * one-line contract.
     */
    private static String oneLine(String message) {
        if (message == null) {
            return null;
        }
        StringBuilder b = null;
        for (int i = 0; i < message.length(); i++) {
            char c = message.charAt(i);
            boolean control = Character.isISOControl(c) || c == '\u2028' || c == '\u2029';
            if (control && b == null) {
                b = new StringBuilder(message.length() + 8).append(message, 0, i);
            }
            if (b != null) {
                if (!control) {
                    b.append(c);
                } else {
                    b.append(switch (c) {
                        case '\n' -> "\\n";
                        case '\r' -> "\\r";
                        case '\t' -> "\\t";
                        default -> String.format("\\u%04x", (int) c);
                    });
                }
            }
        }
        return b == null ? message : b.toString();
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
