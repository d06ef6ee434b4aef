package org.roseate.value;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Optional;
import org.junit.jupiter.api.Test;

class ComponentKindTest {
    @Test
    void lettersAndUnits() {
        // Designators R, C, L: common practice (IEEE 315 / IEC 60617 reference designations).
        // Unit symbols Ω, F, H: BIPM SI Brochure, 9th ed., table 4.
        assertEquals('R', ComponentKind.RESISTOR.letter());
        assertEquals('C', ComponentKind.CAPACITOR.letter());
        assertEquals('L', ComponentKind.INDUCTOR.letter());
        assertEquals("\u03A9", ComponentKind.RESISTOR.unitSymbol());
        assertEquals("F", ComponentKind.CAPACITOR.unitSymbol());
        assertEquals("H", ComponentKind.INDUCTOR.unitSymbol());
    }

    @Test
    void ofLetterIgnoresCaseAndRejectsOthers() {
        assertEquals(Optional.of(ComponentKind.RESISTOR), ComponentKind.ofLetter('R'));
        assertEquals(Optional.of(ComponentKind.CAPACITOR), ComponentKind.ofLetter('c'));
        assertEquals(Optional.of(ComponentKind.INDUCTOR), ComponentKind.ofLetter('L'));
        assertTrue(ComponentKind.ofLetter('Q').isEmpty());
        assertTrue(ComponentKind.ofLetter('1').isEmpty());
    }
}
