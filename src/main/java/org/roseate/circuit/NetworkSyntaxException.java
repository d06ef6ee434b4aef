package org.roseate.circuit;

/**
 * A network expression that cannot be read. {@link #column()} is 1-based within the expression
 * string; {@link #detail()} says what was expected and what was found, without the location.
 */
public final class NetworkSyntaxException extends RuntimeException {
    private final int column;
    private final String detail;

    public NetworkSyntaxException(int column, String detail) {
        super("column " + column + ": " + detail);
        this.column = column;
        this.detail = detail;
    }

    public int column() {
        return column;
    }

    public String detail() {
        return detail;
    }
}
