package org.roseate.circuit;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/** Reading, writing and checking {@code circuit} stages (issue 11's file format and bad inputs). */
class CircuitStageReaderTest {
    private static final String SALLEN_KEY = "{\"kind\": \"circuit\", \"input\": \"in\", \"output\": \"out\","
            + " \"branches\": {\"in a\": \"R1(680k)\", \"a b\": \"R2(680k)\", \"a out\": \"C1(220n)\", \"b gnd\": \"C2(100n)\"},"
            + " \"opamps\": {\"U1\": {\"plus\": \"b\", \"minus\": \"out\", \"output\": \"out\", \"gbwHz\": 1e6, \"openLoopGain\": 2e5}}}";

    private static Design read(String... stages) {
        return DesignReader.parse("{\"name\": \"t\", \"tolerance\": {\"R\": \"1%\", \"C2\": \"2%\"}, \"stages\": ["
                + String.join(", ", stages) + "]}", "t.json");
    }

    @Test
    void readsTheIssueExample() {
        Design d = read(SALLEN_KEY);
        CircuitStage c = (CircuitStage) d.stages().get(0);
        assertEquals("in", c.input());
        assertEquals("out", c.output());
        assertEquals(java.util.List.of("in a", "a b", "a out", "b gnd"), java.util.List.copyOf(c.branches().keySet()));
        CircuitOpAmp u1 = c.opamps().get("U1");
        assertEquals(new CircuitOpAmp("b", "out", "out", new OpAmp(1e6, 2e5)), u1);
        assertEquals(4, d.components().size());
        assertEquals("2%", d.toleranceOf(d.component("C2").orElseThrow()).orElseThrow().toString());
    }

    @Test
    void withoutGbwTheOpAmpIsIdeal() {
        CircuitStage c = (CircuitStage) read(SALLEN_KEY.replace(", \"gbwHz\": 1e6, \"openLoopGain\": 2e5", "")).stages().get(0);
        assertTrue(c.opamps().get("U1").model().isIdeal());
        DesignException e = assertThrows(DesignException.class, () -> read(SALLEN_KEY.replace("\"gbwHz\": 1e6, ", "")));
        assertEquals("t.json: stage 1 (circuit) opamps U1 openLoopGain: needs gbwHz as well (without gbwHz the op-amp is ideal)",
                e.getMessage());
    }

    @Test
    void writerRoundTrips() {
        Design d = read(SALLEN_KEY, SALLEN_KEY.replace("R1", "R11").replace("R2", "R12").replace("C1", "C11")
                .replace("C2", "C12").replace("U1", "U2").replace(", \"gbwHz\": 1e6, \"openLoopGain\": 2e5", ""));
        String json = DesignWriter.toJson(d);
        assertEquals(d, DesignReader.parse(json, "again.json"));
    }

    @Test
    void valuesAndTolerancesReachBranchParts() {
        Design d = read(SALLEN_KEY).withValue("R2", 330e3);
        assertEquals(330e3, d.component("R2").orElseThrow().value());
        CircuitStage c = (CircuitStage) d.stages().get(0);
        assertEquals("R2(330k)", c.branches().get("a b").toExpression());
    }

    @Test
    void designatorsAreUniqueAcrossTheDesignIncludingOpAmps() {
        DesignException e = assertThrows(DesignException.class, () -> read(SALLEN_KEY,
                "{\"kind\": \"inverting\", \"input\": \"R5(10k)\", \"feedback\": \"R1(10k)\"}"));
        assertEquals("t.json: designator R1 is used twice (stage 1 branch 'in a' and stage 2 feedback); each part needs its own designator",
                e.getMessage());
        String second = SALLEN_KEY.replace("R1", "R11").replace("R2", "R12").replace("C1", "C11").replace("C2", "C12");
        e = assertThrows(DesignException.class, () -> read(SALLEN_KEY, second));
        assertTrue(e.getMessage().startsWith("t.json: designator U1 is used twice (stage 1 opamps and stage 2 opamps)"), e.getMessage());
    }

    /** Every structural bad input of issue 11: message names file, stage, key and what was expected; the role is the key path. */
    @ParameterizedTest
    @CsvSource(delimiter = '#', value = {
        "\"input\": \"in\", \"output\": \"out\", \"branches\": {\"in a\": \"R1(1k)\", \"a out\": \"R2(1k)\"}, \"opamps\": {\"U1\": {\"plus\": \"x\", \"minus\": \"a\", \"output\": \"out\"}}"
            + "# stage 1 (circuit) opamps U1 plus: unknown node 'x'; expected one of a, gnd, in, out # opamps/U1/plus",
        "\"input\": \"q\", \"output\": \"out\", \"branches\": {\"in out\": \"R1(1k)\", \"out gnd\": \"R2(1k)\"}"
            + "# stage 1 (circuit) input: unknown node 'q'; expected a node named by a branch or an op-amp pin: gnd, in, out # input",
        "\"input\": \"in\", \"output\": \"q\", \"branches\": {\"in out\": \"R1(1k)\", \"out gnd\": \"R2(1k)\"}"
            + "# stage 1 (circuit) output: unknown node 'q'; expected one of gnd, in, out # output",
        "\"input\": \"in\", \"output\": \"out\", \"branches\": {\"in out\": \"R1(1k)\", \"out gnd\": \"R2(1k)\", \"out d\": \"R3(1k)\"}"
            + "# stage 1 (circuit) branches 'out d': node 'd' is dangling: only this branch touches it; connect it to another branch or an op-amp pin # branches/out d",
        "\"input\": \"in\", \"output\": \"out\", \"branches\": {\"in out\": \"R1(1k)\", \"out out\": \"R2(1k)\"}"
            + "# stage 1 (circuit) branches 'out out': a branch from node 'out' to itself; expected two different nodes # branches/out out",
        "\"input\": \"in\", \"output\": \"out\", \"branches\": {\"in out\": \"R1(1k)\", \"out in\": \"C1(1n)\", \"out gnd\": \"R2(1k)\"}"
            + "# stage 1 (circuit) branches 'out in': nodes out and in are already joined by branch 'in out'; put both networks in one branch with || # branches/out in",
        "\"input\": \"gnd\", \"output\": \"out\", \"branches\": {\"gnd out\": \"R1(1k)\", \"out a\": \"R2(1k)\"}"
            + "# stage 1 (circuit) input: the input cannot be gnd, the reference node; name the node the source drives # input",
        "\"input\": \"in\", \"output\": \"a\", \"branches\": {\"in a\": \"R1(1k)\", \"a gnd\": \"R2(1k)\"}, \"opamps\": {\"U1\": {\"plus\": \"a\", \"minus\": \"a\", \"output\": \"gnd\"}}"
            + "# stage 1 (circuit) opamps U1 output: an op-amp output cannot be tied to gnd # opamps/U1/output",
        "\"input\": \"in\", \"output\": \"a\", \"branches\": {\"in a\": \"R1(1k)\", \"a gnd\": \"R2(1k)\"}, \"opamps\": {\"U1\": {\"plus\": \"a\", \"minus\": \"in\", \"output\": \"in\"}}"
            + "# stage 1 (circuit) opamps U1 output: an op-amp output cannot be tied to the input node 'in', which the source drives # opamps/U1/output",
        "\"input\": \"in\", \"output\": \"a\", \"branches\": {\"in  a\": \"R1(1k)\", \"a gnd\": \"R2(1k)\"}"
            + "# stage 1 (circuit) branches 'in  a': a branch key must be two node names (letters, digits, _) separated by one space, such as \"in a\" # branches/in  a",
        "\"input\": \"in\", \"output\": \"out\", \"branches\": {\"in out\": \"R1(1k)\", \"out gnd\": \"R2(1k)\", \"p q\": \"R3(1k)\", \"q p2\": \"R4(1k)\", \"p2 p\": \"C1(1n)\"}"
            + "# stage 1 (circuit) branches: nodes p, p2, q have no connection to gnd, the input or an op-amp output, so the circuit's equations are singular at every frequency # branches",
        "\"input\": \"in\", \"output\": \"out\", \"branches\": {\"in out\": \"R1(1k)\", \"out gnd\": \"R2(1k)\"}, \"opamps\": {\"U1\": {\"plus\": \"in\", \"minus\": \"out\", \"output\": \"out\"}, \"U2\": {\"plus\": \"in\", \"minus\": \"out\", \"output\": \"out\"}}"
            + "# stage 1 (circuit) opamps U2 output: node 'out' is already driven by U1; two outputs cannot drive one node # opamps/U2/output",
        "\"input\": \"in\", \"output\": \"out\", \"branches\": {\"in out\": \"R1(1k) + \"}"
            + "# stage 1 branch 'in out', column 10: expected a component or '(' after '+', found the end # branches/in out",
    })
    void structuralBadInputs(String body, String message, String role) {
        DesignException e = assertThrows(DesignException.class, () -> read("{\"kind\": \"circuit\", " + body + "}"));
        assertEquals("t.json: " + message.strip(), e.getMessage());
        assertEquals(role.strip(), e.role());
        assertEquals(1, e.stageNumber().orElseThrow());
    }

    @Test
    void duplicateJsonKeysAreRefused() {
        DesignException e = assertThrows(DesignException.class, () -> read(
                "{\"kind\": \"circuit\", \"input\": \"in\", \"output\": \"out\", \"branches\": {\"in out\": \"R1(1k)\", \"in out\": \"R2(1k)\"}}"));
        assertTrue(e.getMessage().startsWith("t.json: stage 1 branches: key 'in out' appears twice (line 1, column "), e.getMessage());
    }

    @Test
    void olderKindsHaveCircuitForms() {
        Network r = NetworkParser.parse("R1(10k)");
        Network c = NetworkParser.parse("C1(10n)");
        CircuitStage inv = new InvertingStage(r, c, java.util.Optional.empty()).asCircuit();
        assertEquals(Map.of("in m", r, "m out", c), inv.branches());
        assertEquals(new CircuitOpAmp("gnd", "m", "out", OpAmp.IDEAL), inv.opamps().get("U1"));
        CircuitStage div = new DividerStage(r, c, java.util.Optional.of(NetworkParser.parse("R2(1M)"))).asCircuit();
        assertEquals("C1(10n) || R2(1M)", div.branches().get("out gnd").toExpression());
    }
}
