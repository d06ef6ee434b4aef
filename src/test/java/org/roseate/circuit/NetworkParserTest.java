package org.roseate.circuit;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;
import static org.junit.jupiter.api.Assertions.assertThrows;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.roseate.value.ComponentKind;

class NetworkParserTest {

    @Test
    void readsNestedChains() {
        Network n = NetworkParser.parse("R2(240k) || C1(1n) || (R3(150k) + C2(12n))");
        Parallel p = assertInstanceOf(Parallel.class, n);
        assertEquals(3, p.parts().size());
        Series s = assertInstanceOf(Series.class, p.parts().get(2));
        Component c = assertInstanceOf(Component.class, s.parts().get(1));
        assertEquals("C2", c.designator());
        assertEquals(ComponentKind.CAPACITOR, c.kind());
        assertEquals(12e-9, c.value(), 1e-21);
    }

    @Test
    void expressionRoundTrips() {
        String text = "R2(240k) || C1(1n) || (R3(150k) + (C2(12n) || L1(10m)))";
        Network n = NetworkParser.parse(text);
        assertEquals(n, NetworkParser.parse(n.toExpression()));
    }

    @Test
    void redundantParenthesesAreFine() {
        assertEquals(NetworkParser.parse("R1(1k) + R2(2k)"), NetworkParser.parse("((R1(1k)) + (R2(2k)))"));
    }

    /** Each bad case gives its message and the 1-based column of the fault. */
    @ParameterizedTest
    @CsvSource(delimiter = ';', value = {
        "'' ; 1 ; empty network",
        "'   ' ; 1 ; empty network",
        "R1(10k) + R2(4kk7) ; 14 ; expected a value such as 4k7 or 22n, found '4kk7'",
        "Q1(10k) ; 1 ; unknown designator letter 'Q' in 'Q1'",
        "RV1(10k) ; 1 ; unknown designator letter 'RV' in 'RV1'",
        "R1(10k) + R2(2k) || C1(1n) ; 18 ; '+' and '||' mixed without parentheses",
        "(R1(10k) + R2(2k) ; 1 ; '(' is never closed",
        "R1(10k) + R2(2k)) ; 17 ; ')' has no matching '('",
        "R1(10k) + ; 10 ; found the end",
        "R1 + R2(2k) ; 4 ; expected '(' and a value after R1",
        "R1(10k) R2(2k) ; 9 ; expected '+', '||'",
        "R1() ; 4 ; found nothing",
        "() ; 2 ; empty parentheses",
        "R(10k) ; 1 ; expected a designator such as R1",
        "R1(10k ; 3 ; never closed",
        "C1(0) ; 4 ; ",
        "C1(-1n) ; 4 ; ",
    })
    void badExpressions(String text, int column, String fragment) {
        NetworkSyntaxException e = assertThrows(NetworkSyntaxException.class, () -> NetworkParser.parse(text));
        assertEquals(column, e.column(), e.getMessage());
        if (fragment != null && !fragment.isBlank()) {
            org.junit.jupiter.api.Assertions.assertTrue(e.detail().contains(fragment), e.detail());
        }
    }
}
