package org.roseate.hardening;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.Timeout;
import org.roseate.circuit.DesignException;
import org.roseate.circuit.DesignReader;

/** Findings of {@link DesignReaderFuzzTest}, kept as plain regression tests with readable inputs. */
class DesignReaderRegressionTest {
    private static String stage(String feedback) {
        return "{\"name\": \"n\", \"stages\": [{\"kind\": \"inverting\", \"input\": \"R1(10k)\", \"feedback\": \""
                + feedback + "\"}]}";
    }

    /** Found by mutatedPreset: a key of NUL characters was quoted raw, so the message was not one clean line. */
    @Test
    void controlCharactersInQuotedTextAreEscaped() {
        for (String text : new String[] {
            "{\"\\u0000\\u0000\": 1}",                          // unknown top-level key
            "{\"name\": \"n\", \"stages\": [{\"kind\": \"a\\nb\"}]}",     // unknown kind with a line break
            stage("R2(4\\nk7)"),                                // value parser quotes the value
            "{\"name\": \"n\", \"stages\": [{\"kind\": \"inverting\", \"input\": \"R1(1k)\", \"feedback\": \"R2(1k)\","
                    + " \"opamp\": {\"gbwHz\": \"1\\r\\n2\"}}]}",           // describe() of a string
            "{\"name\": \"n\", \"tolerance\": {\"R\": \"x\\u2028y\"}, \"stages\": [{\"kind\": \"inverting\","
                    + " \"input\": \"R1(1k)\", \"feedback\": \"R2(1k)\"}]}"}) {
            DesignException e = assertThrows(DesignException.class, () -> DesignReader.parse(text, "d.json"), text);
            Contract.oneLine(e.getMessage(), "d.json: ", e);
        }
    }

    /** The escape keeps the culprit visible: a line break reads as the two characters \n. */
    @Test
    void escapedCharacterStaysVisible() {
        DesignException e = assertThrows(DesignException.class,
                () -> DesignReader.parse("{\"name\": \"n\", \"stages\": [{\"kind\": \"a\\nb\"}]}", "d.json"));
        assertEquals("d.json: stage 1: unknown kind 'a\\nb'; expected inverting, noninverting, divider or circuit", e.getMessage());
    }

    /**
     * Found by mutatedPreset: a network nested in thousands of parentheses overflowed the parser's
     * recursion (StackOverflowError, not a DesignException).
     */
    @Test
    @Timeout(value = 10, unit = TimeUnit.SECONDS)
    void deepParenthesesGiveADesignException() {
        int depth = 20000;
        String net = "(".repeat(depth) + "R2(10k)" + ")".repeat(depth);
        DesignException e = assertThrows(DesignException.class, () -> DesignReader.parse(stage(net), "d.json"));
        Contract.oneLine(e.getMessage(), "d.json: ", e);
        assertTrue(e.getMessage().contains("nested"), e.getMessage());
    }

    /** Nesting well inside the limit still reads: the guard must not reject real designs. */
    @Test
    void moderateNestingStillReads() {
        String net = "(".repeat(50) + "R2(10k) || C1(1n)" + ")".repeat(50);
        assertEquals(1, DesignReader.parse(stage(net), "d.json").stages().size());
    }
}
