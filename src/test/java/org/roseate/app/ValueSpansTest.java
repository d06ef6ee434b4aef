package org.roseate.app;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Optional;
import org.junit.jupiter.api.Test;

class ValueSpansTest {
    private static final String TEXT = """
            {
                "name":"odd spacing",
              "stages": [ { "kind": "inverting", "input": "R1(47k)",
                "feedback": "R10(75k) || C1( 3n3 ) || (R3(51k) + C2(39n))",
                "opamp": { "gbwHz": 3e6 } } ]
            }
            """;

    private static String value(String text, String designator) {
        TextSpan s = ValueSpans.find(text, designator).orElseThrow();
        return text.substring(s.start(), s.end());
    }

    @Test
    void findsTheValueBetweenTheParentheses() {
        assertEquals("47k", value(TEXT, "R1"));
        assertEquals("75k", value(TEXT, "R10"));
        assertEquals("3n3", value(TEXT, "C1"), "spaces inside the parentheses stay outside the span");
        assertEquals("39n", value(TEXT, "C2"));
    }

    @Test
    void replacingChangesOnlyTheValueCharacters() {
        String edited = ValueSpans.replace(TEXT, "C1", "3n9").orElseThrow();
        assertEquals(TEXT.replace("C1( 3n3 )", "C1( 3n9 )"), edited);
        assertTrue(edited.contains("3e6"));
    }

    @Test
    void aPartKeyedByItsDesignatorIsFound() {
        String text = "{\n  \"parts\": { \"R7\": \"4k7\", \"C9\": 1e-9 },\n  \"net\": \"R7 C9\"\n}\n";
        assertEquals("4k7", value(text, "R7"));
        assertEquals("1e-9", value(text, "C9"));
    }

    @Test
    void aDesignatorWrittenTwiceOrNotAtAllHasNoPlace() {
        String twice = TEXT.replace("R3(51k)", "R1(51k)");
        assertEquals(Optional.empty(), ValueSpans.find(twice, "R1"));
        assertEquals(Optional.empty(), ValueSpans.find(TEXT, "R9"));
        assertEquals(Optional.empty(), ValueSpans.replace(twice, "R1", "1k"));
    }

    @Test
    void textInKeysAndOtherStringsIsNotAValue() {
        String text = "{ \"name\": \"R1 is (47k) here\", \"stages\": [ { \"input\": \"R1(47k)\" } ] }";
        TextSpan s = ValueSpans.find(text, "R1").orElseThrow();
        assertEquals(text.lastIndexOf("47k"), s.start());
    }
}
