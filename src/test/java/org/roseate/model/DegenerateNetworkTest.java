package org.roseate.model;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import org.junit.jupiter.api.Test;
import org.roseate.circuit.DesignException;
import org.roseate.circuit.DesignReader;

/**
 * Networks whose impedance is zero or infinite at every frequency in double precision. With
 * positive finite parts this happens only when values leave the representable range (their
 * products underflow or overflow); the model refuses them rather than render silence or NaN.
 */
class DegenerateNetworkTest {
    private static String design(String input, String feedback) {
        return "{\"name\": \"x\", \"stages\": [{\"kind\": \"inverting\", \"input\": \"" + input
                + "\", \"feedback\": \"" + feedback + "\"}]}";
    }

    @Test
    void shortAtEveryFrequency() {
        var d = DesignReader.parse(design("R1(1e-200) || R2(1e-200)", "R3(10k)"), "d.json");
        DesignException e = assertThrows(DesignException.class, () -> CircuitModel.of(d, "d.json"));
        assertEquals("d.json: stage 1 input: it is a short circuit at every frequency; check the values", e.getMessage());
    }

    /**
     * The open-circuit case cannot arise from finite parts once each impedance is normalised (a
     * chain of tiny capacitors is still a tiny capacitor); its overflow twin can.
     */
    @Test
    void valuesThatOverflow() {
        var d = DesignReader.parse(design("R1(10k)", "R2(1e200) || R3(1e200)"), "d.json");
        DesignException e = assertThrows(DesignException.class, () -> CircuitModel.of(d, "d.json"));
        assertEquals("d.json: stage 1 feedback: its values are out of range (impedance overflows); check the values", e.getMessage());
    }

    @Test
    void tinyButRepresentablePartsStillModel() {
        var d = DesignReader.parse(design("R1(10k)", "C1(1e-200) + C2(1e-200)"), "d.json");
        // 1e-200 F in series with itself is 5e-201 F: |Z| = 1/(2π·f·C) at 1 kHz.
        double expected = 1e4 * 2 * Math.PI * 1000 * 5e-201;
        assertEquals(1, CircuitModel.of(d, "d.json").response(1000).abs() * expected, 1e-9);
    }
}
