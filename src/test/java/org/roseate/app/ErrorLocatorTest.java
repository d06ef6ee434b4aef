package org.roseate.app;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.roseate.circuit.DesignException;

class ErrorLocatorTest {
    private static final String GOOD = DefaultDesign.TEXT;

    private static DesignOutcome read(String text) {
        return DesignOutcome.of(text, "editor", AnalysisSettings.DEFAULT);
    }

    @Test
    void badValuePointsAtTheValueInTheText() {
        String text = GOOD.replace("R3(150k)", "R3(15kk0)");
        DesignOutcome o = read(text);
        DesignException e = o.error();
        assertTrue(e.getMessage().startsWith("editor: stage 1 feedback"), e.getMessage());
        TextSpan s = o.errorSpan().orElseThrow();
        // the reference position is the bad token's own offset in the text, found by indexOf
        assertEquals(text.indexOf("15kk0"), s.start());
        assertEquals("15kk0", text.substring(s.start(), s.end()));
        assertEquals(text.substring(0, s.start()).split("\n", -1).length, s.line());
    }

    @Test
    void unknownDesignatorLetterPointsAtThePart() {
        String text = GOOD.replace("\"R1(47k)\"", "\"Q1(47k)\"");
        TextSpan s = read(text).errorSpan().orElseThrow();
        assertEquals(text.indexOf("Q1(47k)"), s.start());
        assertEquals("Q1", text.substring(s.start(), s.end()));
    }

    @Test
    void escapesBeforeTheColumnAreCounted() {
        // "\u0052" is R: the decoded expression is R1(4kk7); the bad value starts at decoded column 4
        String text = GOOD.replace("\"R1(47k)\"", "\"\\u00521(4kk7)\"");
        TextSpan s = read(text).errorSpan().orElseThrow();
        assertEquals(text.indexOf("4kk7"), s.start());
    }

    @Test
    void invalidJsonPointsAtTheLineTheReaderNames() {
        String text = GOOD.replace("\"kind\": \"inverting\",", "\"kind\": \"inverting\"");
        DesignOutcome o = read(text);
        assertTrue(o.error().getMessage().contains("invalid JSON at line"), o.error().getMessage());
        TextSpan s = o.errorSpan().orElseThrow();
        int line = Integer.parseInt(o.error().getMessage().replaceAll(".*line (\\d+).*", "$1"));
        assertEquals(line, s.line());
    }

    @Test
    void missingKeyMarksTheStage() {
        String text = GOOD.replace("\"input\": \"R1(47k)\",", "");
        DesignOutcome o = read(text);
        assertTrue(o.error().getMessage().contains("missing key 'input'"), o.error().getMessage());
        TextSpan s = o.errorSpan().orElseThrow();
        assertTrue(text.substring(s.start(), s.end()).contains("{"), "the stage's opening line");
    }

    @Test
    void unknownKeyMarksTheKeyName() {
        String text = GOOD.replace("\"feedback\":", "\"feedbak\":");
        DesignOutcome o = read(text);
        assertTrue(o.error().getMessage().contains("unknown key 'feedbak'"), o.error().getMessage());
        TextSpan s = o.errorSpan().orElseThrow();
        assertEquals(text.indexOf("feedbak"), s.start());
        assertEquals("feedbak", text.substring(s.start(), s.end()));
    }

    @Test
    void aGoodDesignHasCurvesAndNoError() {
        DesignOutcome o = read(GOOD);
        assertTrue(o.ok());
        assertEquals(31, o.curves().bands().size()); // IEC 61260-1: 31 third-octave bands from 20 Hz to 20 kHz
    }

    private static final String CIRCUIT = "{\"name\": \"c\", \"stages\": [{\"kind\": \"circuit\", \"input\": \"in\", \"output\": \"out\",\n"
            + "  \"branches\": {\"in a\": \"R1(68k)\", \"a b\": \"R2(33k)\", \"a out\": \"C1(470n)\", \"b gnd\": \"C2(220n)\"},\n"
            + "  \"opamps\": {\"U1\": {\"plus\": \"b\", \"minus\": \"out\", \"output\": \"out\"}}}]}";

    @Test
    void circuitBranchErrorPointsIntoTheBranchValue() {
        String text = CIRCUIT.replace("R2(33k)", "R2(33kk)");
        TextSpan s = read(text).errorSpan().orElseThrow();
        assertEquals(text.indexOf("33kk"), s.start());
    }

    @Test
    void circuitPinErrorPointsAtThePinValue() {
        String text = CIRCUIT.replace("\"plus\": \"b\"", "\"plus\": \"zz\"");
        DesignOutcome o = read(text);
        assertTrue(o.error().getMessage().contains("opamps U1 plus: unknown node 'zz'"), o.error().getMessage());
        TextSpan s = o.errorSpan().orElseThrow();
        assertEquals(text.indexOf("zz"), s.start());
        assertEquals("zz", text.substring(s.start(), s.end()));
    }

    @Test
    void aCircuitDesignHasCurves() {
        DesignOutcome o = read(CIRCUIT);
        assertTrue(o.ok(), () -> o.error().getMessage());
        assertEquals(31, o.curves().bands().size()); // IEC 61260-1: 31 third-octave bands from 20 Hz to 20 kHz
    }
}
