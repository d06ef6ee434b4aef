package org.roseate.budget;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;

/** Gaussian exceedance P(|x| &gt; k·σ) against scipy and a printed table. */
class GaussianTest {

    @Test
    void exceedanceMatchesScipyErfc() throws Exception {
        // src/test/python/gen_gaussian_exceedance.py: scipy.special.erfc(k/√2)
        List<String> lines = Files.readAllLines(Path.of("src/test/resources/reference/budget/gaussian_exceedance.csv"));
        int checked = 0;
        for (String line : lines) {
            if (line.startsWith("#") || line.startsWith("k,")) {
                continue;
            }
            String[] kv = line.split(",");
            double k = Double.parseDouble(kv[0]);
            double p = Double.parseDouble(kv[1]);
            // Hipparchus erfc (continued fraction / series) against scipy's: 1e-12 relative
            assertEquals(p, Gaussian.exceedanceProbability(k * 0.7, 0.7), p * 1e-12, "k = " + k);
            checked++;
        }
        assertTrue(checked >= 15);
    }

    @Test
    void exceedanceMatchesTheNormalTable() {
        // Abramowitz & Stegun table 26.1 (2·(1 − P(x))): 1σ 0.31731, 2σ 0.04550, 3σ 0.00270; 5 decimals.
        assertEquals(0.31731, Gaussian.exceedanceProbability(1, 1), 0.5e-5);
        assertEquals(0.04550, Gaussian.exceedanceProbability(2, 1), 0.5e-5);
        assertEquals(0.00270, Gaussian.exceedanceProbability(3, 1), 0.5e-5);
        assertEquals(0, Gaussian.exceedanceProbability(1, 0));
    }
}
