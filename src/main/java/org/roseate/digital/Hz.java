package org.roseate.digital;

import java.math.BigDecimal;
import java.math.MathContext;

/** Formatting for user messages: four significant digits, plain notation. */
final class Hz {
    private Hz() {
    }

    static String format(double value) {
        if (!Double.isFinite(value)) {
            return Double.toString(value);
        }
        if (value == 0) {
            return "0";
        }
        return new BigDecimal(value).round(new MathContext(4)).stripTrailingZeros().toPlainString();
    }
}
