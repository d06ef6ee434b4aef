package org.roseate.circuit;

import java.util.List;
import java.util.stream.Collectors;

final class Chains {
    private Chains() {
    }

    static String join(List<Network> parts, String operator, boolean nested) {
        String body = parts.stream().map(p -> p.toExpression(true)).collect(Collectors.joining(operator));
        return nested ? "(" + body + ")" : body;
    }
}
