package org.roseate.circuit;

import java.util.ArrayList;
import java.util.List;
import org.roseate.value.ComponentKind;
import org.roseate.value.EngineeringValue;
import org.roseate.value.ValueFormatException;

/**
 * Reads a network expression such as {@code R1(360k) || (R2(33k) + C2(33n))}.
 *
 * <p>Grammar: {@code chain := term (op term)*}, where every {@code op} in one chain is the same,
 * {@code +} (series) or {@code ||} (parallel); {@code term := component | '(' chain ')'};
 * {@code component := designator '(' value ')'}. The designator's letter gives the kind: R, C or
 * L. Values are read by {@link EngineeringValue#parse}. Mixing {@code +} and {@code ||} in one
 * chain without parentheses is an error rather than a precedence rule, because both readings
 * are common on schematics. Errors carry the 1-based column of the offending character.
 */
public final class NetworkParser {
    /**
     * Deepest parenthesis nesting accepted. Real networks nest two or three levels; the limit keeps
     * the recursive descent (and the model's recursion over the tree) far from the thread's stack.
     */
    public static final int MAX_NESTING = 100;

    private final String text;
    private int pos;
    private int depth;

    private NetworkParser(String text) {
        this.text = text;
    }

    /** Parses one expression; throws {@link NetworkSyntaxException} with a column on bad input. */
    public static Network parse(String text) {
        NetworkParser p = new NetworkParser(text);
        p.skipSpace();
        if (p.pos == text.length()) {
            throw new NetworkSyntaxException(1, "empty network: expected a component such as R1(10k)");
        }
        Network n = p.chain();
        p.skipSpace();
        if (p.pos < text.length()) {
            if (text.charAt(p.pos) == ')') {
                throw p.error("unbalanced parentheses: ')' has no matching '('");
            }
            throw p.error("expected '+', '||' or the end, found '" + p.rest() + "'");
        }
        return n;
    }

    private enum Op { SERIES, PARALLEL }

    private Network chain() {
        List<Network> parts = new ArrayList<>();
        parts.add(term());
        Op chainOp = null;
        int firstOpColumn = 0;
        while (true) {
            skipSpace();
            if (pos >= text.length() || text.charAt(pos) == ')') {
                break;
            }
            int opStart = pos;
            Op op;
            if (text.startsWith("||", pos)) {
                op = Op.PARALLEL;
                pos += 2;
            } else if (text.charAt(pos) == '+') {
                op = Op.SERIES;
                pos += 1;
            } else {
                throw error("expected '+', '||' or ')', found '" + rest() + "'");
            }
            if (chainOp == null) {
                chainOp = op;
                firstOpColumn = opStart + 1;
            } else if (op != chainOp) {
                pos = opStart;
                throw error("'+' and '||' mixed without parentheses (chain began with '"
                        + (chainOp == Op.SERIES ? "+" : "||") + "' at column " + firstOpColumn
                        + "); group them, e.g. R1(1k) + (R2(2k) || C1(10n))");
            }
            skipSpace();
            if (pos >= text.length()) {
                throw error("expected a component or '(' after '" + (op == Op.SERIES ? "+" : "||") + "', found the end");
            }
            parts.add(term());
        }
        if (parts.size() == 1) {
            return parts.get(0);
        }
        return chainOp == Op.SERIES ? new Series(parts) : new Parallel(parts);
    }

    private Network term() {
        skipSpace();
        if (pos >= text.length()) {
            throw error("expected a component such as R1(10k) or '(', found the end");
        }
        char c = text.charAt(pos);
        if (c == '(') {
            int open = pos;
            if (depth == MAX_NESTING) {
                throw error("parentheses nested deeper than " + MAX_NESTING + " levels");
            }
            depth++;
            pos++;
            skipSpace();
            if (pos < text.length() && text.charAt(pos) == ')') {
                throw error("empty parentheses: expected a component such as R1(10k)");
            }
            Network inner = chain();
            skipSpace();
            if (pos >= text.length() || text.charAt(pos) != ')') {
                pos = open;
                throw error("unbalanced parentheses: '(' is never closed");
            }
            pos++;
            depth--;
            return inner;
        }
        if (c == ')') {
            throw error("unbalanced parentheses: ')' has no matching '('");
        }
        if (Character.isLetter(c)) {
            return component();
        }
        throw error("expected a component such as R1(10k) or '(', found '" + rest() + "'");
    }

    private Network component() {
        int start = pos;
        while (pos < text.length() && Character.isLetter(text.charAt(pos))) {
            pos++;
        }
        String prefix = text.substring(start, pos);
        int digitsStart = pos;
        while (pos < text.length() && (Character.isLetterOrDigit(text.charAt(pos)) || text.charAt(pos) == '_')) {
            pos++;
        }
        String designator = text.substring(start, pos);
        if (pos == digitsStart || !Character.isDigit(text.charAt(digitsStart))) {
            pos = start;
            throw error("expected a designator such as R1, C2 or L3, found '" + designator + "'");
        }
        ComponentKind kind = prefix.length() == 1 ? ComponentKind.ofLetter(prefix.charAt(0)).orElse(null) : null;
        if (kind == null) {
            pos = start;
            throw error("unknown designator letter '" + prefix + "' in '" + designator
                    + "': expected R (resistor), C (capacitor) or L (inductor)");
        }
        skipSpace();
        if (pos >= text.length() || text.charAt(pos) != '(') {
            throw error("expected '(' and a value after " + designator + ", e.g. " + designator + "(10k)");
        }
        pos++;
        int valueStart = pos;
        int close = text.indexOf(')', pos);
        int nextOpen = text.indexOf('(', pos);
        if (close < 0 || (nextOpen >= 0 && nextOpen < close)) {
            pos = valueStart - 1;
            throw error("unbalanced parentheses: the value of " + designator + " is never closed with ')'");
        }
        String valueText = text.substring(valueStart, close);
        if (valueText.isBlank()) {
            pos = valueStart;
            throw error("expected a value such as 4k7 or 22n for " + designator + ", found nothing");
        }
        double value;
        try {
            value = EngineeringValue.parse(valueText, kind);
        } catch (ValueFormatException e) {
            // The column points at the value's start, so it reads well with the quoted text.
            pos = valueStart + leadingSpaces(valueText);
            throw error(e.getMessage());
        }
        pos = close + 1;
        return new Component(designator, kind, value);
    }

    private static int leadingSpaces(String s) {
        int i = 0;
        while (i < s.length() && Character.isWhitespace(s.charAt(i))) {
            i++;
        }
        return i;
    }

    private void skipSpace() {
        while (pos < text.length() && Character.isWhitespace(text.charAt(pos))) {
            pos++;
        }
    }

    private String rest() {
        int end = pos;
        while (end < text.length() && end < pos + 12 && !Character.isWhitespace(text.charAt(end))) {
            end++;
        }
        return end == pos ? text.substring(pos, Math.min(text.length(), pos + 1)) : text.substring(pos, end);
    }

    private NetworkSyntaxException error(String detail) {
        return new NetworkSyntaxException(pos + 1, detail);
    }
}
