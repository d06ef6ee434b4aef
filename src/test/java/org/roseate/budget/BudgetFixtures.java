package org.roseate.budget;

import org.roseate.circuit.Design;
import org.roseate.circuit.DesignReader;

/** Small designs for the closed-form tests (values invented). */
final class BudgetFixtures {
    private BudgetFixtures() {
    }

    static Design parse(String json) {
        return DesignReader.parse(json, "test");
    }

    /** An inverting amplifier Rin = R1, Rf = R2 with an ideal op-amp and the given noise keys. */
    static Design inverting(String rin, String rf, String opampKeys, String topKeys) {
        return parse("{\"name\": \"inv\", " + topKeys + " \"stages\": [{\"kind\": \"inverting\", \"input\": \"R1(" + rin
                + ")\", \"feedback\": \"R2(" + rf + ")\", \"opamp\": {" + opampKeys + "}}]}");
    }

    /** A passive RC low-pass: series R1, shunt C1. */
    static Design rcLowPass(String r, String c, String topKeys) {
        return parse("{\"name\": \"rc\", " + topKeys + " \"stages\": [{\"kind\": \"divider\", \"series\": \"R1(" + r
                + ")\", \"shunt\": \"C1(" + c + ")\"}]}");
    }
}
