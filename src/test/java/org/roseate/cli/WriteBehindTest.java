package org.roseate.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.io.IOException;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;

/** {@link WriteBehind}: blocks reach the sink in submission order; a sink failure reaches the caller. */
class WriteBehindTest {
    @Test
    void blocksAreWrittenInOrderWithTheirFrameCounts() throws Exception {
        List<String> written = new ArrayList<>();
        try (WriteBehind w = new WriteBehind(4, (s, n) -> written.add((int) s[0] + ":" + n))) {
            for (int i = 0; i < 50; i++) {
                double[] b = w.spare();
                b[0] = i;
                w.submit(b, 1 + i % 4);
            }
            w.finish();
        }
        assertEquals(50, written.size());
        for (int i = 0; i < 50; i++) {
            assertEquals(i + ":" + (1 + i % 4), written.get(i));
        }
    }

    @Test
    void aSinkFailureIsRethrownToTheCaller() {
        IOException boom = new IOException("disk full");
        IOException got = assertThrows(IOException.class, () -> {
            try (WriteBehind w = new WriteBehind(4, (s, n) -> {
                if (s[0] == 3) {
                    throw boom;
                }
            })) {
                for (int i = 0; i < 1000; i++) {
                    double[] b = w.spare();
                    b[0] = i;
                    w.submit(b, 1);
                }
                w.finish();
            }
        });
        assertSame(boom, got);
    }
}
