package org.roseate.app;

import com.fasterxml.jackson.core.JsonFactory;
import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.core.JsonToken;
import java.io.IOException;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * Finds where a component's value is written in the design text, so that an edit replaces only
 * those characters and leaves everything else (indentation, key order, number spelling such as
 * {@code 3e6}, keys left at their defaults) exactly as the user wrote it.
 *
 * <p>Two spellings are recognised: a part inside a network expression string,
 * {@code "R2(75k) || C1(3n3)"}, where the value is the text between the parentheses after the
 * designator; and a key named after the part, {@code "R1": "47k"}, where the value is the string's
 * content (or the number's text). The place must be unique: a designator written twice, or not in
 * either spelling, gives no place, and the caller refuses the edit rather than rewrite the file.
 */
final class ValueSpans {
    private static final JsonFactory JSON = new JsonFactory();

    private ValueSpans() {
    }

    /**
     * The span of {@code designator}'s value text in {@code text}, or empty when it is not written
     * exactly once (or the text is not readable JSON up to that point).
     */
    static Optional<TextSpan> find(String text, String designator) {
        List<int[]> found = new ArrayList<>();
        Pattern inExpression = Pattern.compile("(?<![A-Za-z0-9_])" + Pattern.quote(designator) + "\\s*\\(\\s*([^()\\s\"\\\\]+)\\s*\\)");
        try (JsonParser p = JSON.createParser(text)) {
            String field = null;
            JsonToken t;
            while ((t = p.nextToken()) != null) {
                if (t == JsonToken.FIELD_NAME) {
                    field = p.currentName();
                    continue;
                }
                int start = (int) p.currentTokenLocation().getCharOffset();
                if (t == JsonToken.VALUE_STRING) {
                    int end = closingQuote(text, start);
                    if (end < 0) {
                        return Optional.empty();
                    }
                    if (designator.equals(field)) {
                        found.add(new int[] {start + 1, end});
                    } else {
                        Matcher m = inExpression.matcher(text).region(start + 1, end);
                        while (m.find()) {
                            found.add(new int[] {m.start(1), m.end(1)});
                        }
                    }
                } else if ((t == JsonToken.VALUE_NUMBER_INT || t == JsonToken.VALUE_NUMBER_FLOAT) && designator.equals(field)) {
                    found.add(new int[] {start, start + p.getText().length()});
                }
                field = null;
            }
        } catch (IOException e) {
            return Optional.empty();
        }
        if (found.size() != 1) {
            return Optional.empty();
        }
        return Optional.of(TextSpan.of(text, found.get(0)[0], found.get(0)[1]));
    }

    /** The offset of the quote that closes the JSON string opening at {@code open}, or −1. */
    private static int closingQuote(String text, int open) {
        if (open < 0 || open >= text.length() || text.charAt(open) != '"') {
            return -1;
        }
        for (int i = open + 1; i < text.length(); i++) {
            char c = text.charAt(i);
            if (c == '\\') {
                i++;
            } else if (c == '"') {
                return i;
            }
        }
        return -1;
    }

    /**
     * {@code text} with {@code designator}'s value text replaced by {@code valueText}, every other
     * character unchanged; empty when the value's place is not unique (see {@link #find}).
     */
    static Optional<String> replace(String text, String designator, String valueText) {
        return find(text, designator).map(s -> text.substring(0, s.start()) + valueText + text.substring(s.end()));
    }
}
