package org.roseate.app;

import com.fasterxml.jackson.core.JsonFactory;
import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.core.JsonToken;
import java.io.IOException;
import java.util.Optional;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.roseate.circuit.DesignException;
import org.roseate.circuit.DesignReader;

/**
 * Finds where in the design text a {@link DesignException} points. A network error carries its
 * stage, role and column inside the network expression: the role's string value is located in the
 * JSON (with Jackson's token offsets) and the column counted through its escapes, the span running
 * to the end of the offending token. A stage-level error (the stage named in the message) marks an
 * unknown key's name, else the stage's opening line; invalid
 * JSON marks the line and column the message names. Other errors have no place.
 */
final class ErrorLocator {
    private static final JsonFactory JSON = new JsonFactory();
    private static final Pattern LINE_COLUMN = Pattern.compile("line (\\d+), column (\\d+)");
    /** Stage-level messages name the stage in their text: "d.json: stage 2 (inverting): missing key 'input'". */
    private static final Pattern STAGE = Pattern.compile(": stage (\\d+)\\b");
    private static final Pattern UNKNOWN_KEY = Pattern.compile("unknown key '([^']+)'");

    private ErrorLocator() {
    }

    static Optional<TextSpan> locate(String text, DesignException e) {
        String message = String.valueOf(e.getMessage());
        if (e.stageNumber().isPresent()) {
            Optional<TextSpan> s = inStage(text, e.stageNumber().getAsInt(), e.role(), e.column().orElse(0), null);
            if (s.isPresent()) {
                return s;
            }
        }
        Matcher st = STAGE.matcher(message);
        if (st.find()) {
            Matcher key = UNKNOWN_KEY.matcher(message);
            Optional<TextSpan> s = inStage(text, Integer.parseInt(st.group(1)), null, 0, key.find() ? key.group(1) : null);
            if (s.isPresent()) {
                return s;
            }
        }
        Matcher m = LINE_COLUMN.matcher(message);
        if (m.find()) {
            int offset = offsetOf(text, Integer.parseInt(m.group(1)), Integer.parseInt(m.group(2)));
            return Optional.of(TextSpan.lineAt(text, offset)).map(l -> TextSpan.of(text, offset,
                    Math.max(offset + 1, Math.min(l.end(), offset + 1))));
        }
        return Optional.empty();
    }

    private static Optional<TextSpan> inStage(String text, int stage, String role, int column, String fieldName) {
        try (JsonParser p = JSON.createParser(text)) {
            if (p.nextToken() != JsonToken.START_OBJECT) {
                return Optional.empty();
            }
            while (p.nextToken() == JsonToken.FIELD_NAME) {
                String key = p.currentName();
                JsonToken t = p.nextToken();
                if (!"stages".equals(key) || t != JsonToken.START_ARRAY) {
                    p.skipChildren();
                    continue;
                }
                int index = 0;
                while ((t = p.nextToken()) != null && t != JsonToken.END_ARRAY) {
                    index++;
                    if (index != stage || t != JsonToken.START_OBJECT) {
                        p.skipChildren();
                        continue;
                    }
                    int objectStart = (int) p.currentTokenLocation().getCharOffset();
                    if (role != null && role.contains(DesignReader.PATH_SEPARATOR)) {
                        Optional<TextSpan> s = inPath(text, p, role.split(DesignReader.PATH_SEPARATOR), 0, column);
                        return s.isPresent() ? s : Optional.of(TextSpan.lineAt(text, objectStart));
                    }
                    if (role != null || fieldName != null) {
                        while (p.nextToken() == JsonToken.FIELD_NAME) {
                            String r = p.currentName();
                            if (r.equals(fieldName)) {
                                int at = (int) p.currentTokenLocation().getCharOffset();
                                return Optional.of(TextSpan.of(text, at + 1, at + 1 + r.length()));
                            }
                            JsonToken v = p.nextToken();
                            if (role != null && r.equals(role) && v == JsonToken.VALUE_STRING) {
                                return Optional.of(inString(text, (int) p.currentTokenLocation().getCharOffset(), column));
                            }
                            p.skipChildren();
                        }
                    }
                    return Optional.of(TextSpan.lineAt(text, objectStart));
                }
                return Optional.empty();
            }
        } catch (IOException | RuntimeException ex) {
            return Optional.empty();
        }
        return Optional.empty();
    }

    /**
     * A circuit stage's nested key path ({@code branches/in a}, {@code opamps/U1/plus}): the
     * parser stands on an object's START_OBJECT; the leaf's string value is marked (at
     * {@code column} when given), or the key's name when the value is not a string.
     */
    private static Optional<TextSpan> inPath(String text, JsonParser p, String[] path, int depth, int column) throws IOException {
        while (p.nextToken() == JsonToken.FIELD_NAME) {
            String name = p.currentName();
            int at = (int) p.currentTokenLocation().getCharOffset();
            JsonToken v = p.nextToken();
            if (!name.equals(path[depth])) {
                p.skipChildren();
                continue;
            }
            if (depth + 1 < path.length && v == JsonToken.START_OBJECT) {
                Optional<TextSpan> inner = inPath(text, p, path, depth + 1, column);
                return inner.isPresent() ? inner : Optional.of(TextSpan.of(text, at + 1, at + 1 + name.length()));
            }
            if (v == JsonToken.VALUE_STRING) {
                return Optional.of(inString(text, (int) p.currentTokenLocation().getCharOffset(), column));
            }
            return Optional.of(TextSpan.of(text, at + 1, at + 1 + name.length()));
        }
        return Optional.empty();
    }

    /**
     * The span of the 1-based decoded {@code column} of the JSON string whose opening quote is at
     * {@code quote}, to the end of its token (letters, digits, '.'); the whole string for column 0.
     */
    static TextSpan inString(String text, int quote, int column) {
        int i = quote + 1;
        int close = i;
        while (close < text.length() && text.charAt(close) != '"') {
            close += text.charAt(close) == '\\' ? (close + 1 < text.length() && text.charAt(close + 1) == 'u' ? 6 : 2) : 1;
        }
        close = Math.min(close, text.length());
        if (column <= 0) {
            return TextSpan.of(text, quote + 1, Math.max(quote + 1, close));
        }
        for (int decoded = 1; decoded < column && i < close; decoded++) {
            i += text.charAt(i) == '\\' ? (i + 1 < text.length() && text.charAt(i + 1) == 'u' ? 6 : 2) : 1;
        }
        int end = i;
        while (end < close && (Character.isLetterOrDigit(text.charAt(end)) || text.charAt(end) == '.')) {
            end++;
        }
        return TextSpan.of(text, i, Math.max(end, Math.min(i + 1, close)));
    }

    /** The char offset of a 1-based line and column, clamped to the text. */
    static int offsetOf(String text, int line, int column) {
        int offset = 0;
        for (int l = 1; l < line; l++) {
            int nl = text.indexOf('\n', offset);
            if (nl < 0) {
                return text.length();
            }
            offset = nl + 1;
        }
        return Math.min(text.length(), offset + Math.max(0, column - 1));
    }
}
