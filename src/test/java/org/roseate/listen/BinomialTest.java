package org.roseate.listen;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.InputStream;
import org.junit.jupiter.api.Test;

class BinomialTest {
    /**
     * Every k for n = 5 … 200 against scipy.stats.binomtest(k, n, 0.5, alternative='greater').pvalue
     * (reference/listen/binomial.json, made by src/test/python/gen_binomial_reference.py). Ours is
     * exact integer arithmetic rounded once; scipy's goes through the regularised incomplete beta
     * function, good to about 1e-14 relative, so 1e-12 relative leaves a margin of 100.
     */
    @Test
    void pValuesMatchScipyBinomtest() throws Exception {
        JsonNode root;
        try (InputStream in = BinomialTest.class.getResourceAsStream("/reference/listen/binomial.json")) {
            root = new ObjectMapper().readTree(in);
        }
        int checked = 0;
        for (JsonNode c : root.get("cases")) {
            int n = c.get("trials").asInt();
            JsonNode p = c.get("pValue");
            assertEquals(n + 1, p.size());
            for (int k = 0; k <= n; k++) {
                double expected = p.get(k).asDouble();
                assertEquals(expected, Binomial.upperTail(k, n), 1e-12 * expected, "n=" + n + ", k=" + k);
                checked++;
            }
        }
        assertEquals(474, checked, "ten trial counts, every k");
    }

    /**
     * Entries of the 4-decimal cumulative binomial table for p = 0.5 (as printed in the CRC Standard
     * Mathematical Tables; from memory), as upper tails P(K ≥ k); tolerance 0.00005, the table's rounding.
     */
    @Test
    void pValuesMatchThePrintedBinomialTable() {
        double[][] rows = {
            // n, k, P(K >= k)
            {10, 8, 0.0547}, {10, 9, 0.0107}, {10, 10, 0.0010},
            {16, 11, 0.1051}, {16, 12, 0.0384}, {16, 13, 0.0106}, {16, 14, 0.0021},
            {20, 14, 0.0577}, {20, 15, 0.0207}, {20, 16, 0.0059},
        };
        for (double[] r : rows) {
            assertEquals(r[2], Binomial.upperTail((int) r[1], (int) r[0]), 0.00005, "n=" + r[0] + ", k=" + r[1]);
        }
    }

    /** From the same table: the first k whose tail is ≤ 0.05 (16 trials: 12, the usual ABX criterion, from memory). */
    @Test
    void smallestSignificantCountsMatchTheTable() {
        assertEquals(5, Binomial.smallestSignificantCount(5, 0.05)); // 1/32 = 0.031
        assertEquals(9, Binomial.smallestSignificantCount(10, 0.05));
        assertEquals(12, Binomial.smallestSignificantCount(16, 0.05));
        assertEquals(15, Binomial.smallestSignificantCount(20, 0.05));
        assertEquals(5, Binomial.smallestSignificantCount(4, 0.05), "4 trials: even 4 of 4 (p = 1/16) is not significant");
        assertEquals(1.0, Binomial.upperTail(0, 16), 0.0);
        assertThrows(IllegalArgumentException.class, () -> Binomial.upperTail(17, 16));
    }
}
