package org.roseate.value;

/**
 * A component value or tolerance that could not be read. {@link #offset()} is the 0-based
 * index, within the text given to the parser (before trimming), of the character at fault,
 * so that a caller reading a design file can point at line and column.
 *
 * <p>It extends {@link IllegalArgumentException}, so callers that treat every bad argument
 * alike need not know this type.
 */
public final class ValueFormatException extends IllegalArgumentException {
    private final int offset;

    /**
     * @param message one line, quoting the text and saying what was expected
     * @param offset  0-based index of the offending character in the original text, >= 0
     */
    public ValueFormatException(String message, int offset) {
        super(message);
        if (offset < 0) {
            throw new IllegalArgumentException("offset=" + offset + " must be >= 0");
        }
        this.offset = offset;
    }

    /** 0-based index within the parsed text of the character at fault. */
    public int offset() {
        return offset;
    }
}
