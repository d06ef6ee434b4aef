package org.roseate.app;

/**
 * A range of the editor text, [start, end) in chars, with the 1-based line and column of its start.
 */
record TextSpan(int start, int end, int line, int column) {
    TextSpan {
        if (start < 0 || end < start) {
            throw new IllegalArgumentException("span " + start + ".." + end + " is not a range");
        }
    }

    /** The span [start, end) of {@code text}, with line and column counted from the text. */
    static TextSpan of(String text, int start, int end) {
        int s = Math.max(0, Math.min(start, text.length()));
        int e = Math.max(s, Math.min(end, text.length()));
        int line = 1;
        int lineStart = 0;
        for (int i = 0; i < s; i++) {
            if (text.charAt(i) == '\n') {
                line++;
                lineStart = i + 1;
            }
        }
        return new TextSpan(s, e, line, s - lineStart + 1);
    }

    /** The whole line that holds {@code offset}, without its line break. */
    static TextSpan lineAt(String text, int offset) {
        int o = Math.max(0, Math.min(offset, text.length()));
        int a = text.lastIndexOf('\n', o - 1) + 1;
        int b = text.indexOf('\n', o);
        return of(text, a, b < 0 ? text.length() : b);
    }
}
