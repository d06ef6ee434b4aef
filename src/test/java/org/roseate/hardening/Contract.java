package org.roseate.hardening;

/**
 * The error contract shared by the fuzz and bad-input tests: a user-facing message is one line
 * (no line break, no other control character) so it fits behind "roseate: " on a terminal.
 */
final class Contract {
    private Contract() {
    }

    /** Throws AssertionError unless {@code message} is non-empty, starts with {@code prefix} and is one clean line. */
    static void oneLine(String message, String prefix, Throwable cause) {
        if (message == null || message.isEmpty()) {
            throw new AssertionError("empty message", cause);
        }
        if (!message.startsWith(prefix)) {
            throw new AssertionError("message does not start with '" + prefix + "': " + message, cause);
        }
        for (int i = 0; i < message.length(); i++) {
            char c = message.charAt(i);
            if (Character.isISOControl(c) || c == '\u2028' || c == '\u2029') {
                throw new AssertionError("message has control character U+" + String.format("%04X", (int) c)
                        + " at " + i + ": " + message, cause);
            }
        }
    }
}
