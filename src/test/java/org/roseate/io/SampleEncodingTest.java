package org.roseate.io;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

class SampleEncodingTest {
    @Test
    void sizesFollowTheRiffSpecification() {
        // reference: Microsoft/IBM Multimedia Programming Interface and Data Specifications 1.0
        // (1991), "Data Format of the Samples": container bytes per sample
        assertEquals(1, SampleEncoding.PCM_8.bytesPerSample());
        assertEquals(2, SampleEncoding.PCM_16.bytesPerSample());
        assertEquals(3, SampleEncoding.PCM_24.bytesPerSample());
        assertEquals(4, SampleEncoding.PCM_32.bytesPerSample());
        assertEquals(4, SampleEncoding.FLOAT_32.bytesPerSample());
        assertEquals(8, SampleEncoding.FLOAT_64.bytesPerSample());
        assertTrue(SampleEncoding.FLOAT_32.isFloat());
        assertFalse(SampleEncoding.PCM_32.isFloat());
        assertEquals(24, SampleEncoding.PCM_24.bitsPerSample());
    }

    @Test
    void parsesEveryLabelAndRejectsOthersQuotingThem() {
        for (SampleEncoding e : SampleEncoding.values()) {
            assertEquals(e, SampleEncoding.parse(e.label()));
        }
        assertEquals(SampleEncoding.FLOAT_32, SampleEncoding.parse(" 32F "));
        IllegalArgumentException ex =
                assertThrows(IllegalArgumentException.class, () -> SampleEncoding.parse("12"));
        assertEquals("sample encoding \"12\" is not known; use 8, 16, 24, 32, 32f or 64f",
                ex.getMessage());
    }

    @Test
    void formatValidatesAgainstHeaderFieldWidths() {
        WavFormat f = new WavFormat(48000, 2, SampleEncoding.PCM_24);
        assertEquals(6, f.bytesPerFrame());
        assertEquals(288000, f.bytesPerSecond());
        assertEquals("sampleRateHz=0 must be > 0", assertThrows(IllegalArgumentException.class,
                () -> new WavFormat(0, 1, SampleEncoding.PCM_16)).getMessage());
        assertEquals("channels=0 must be in 1..65535", assertThrows(IllegalArgumentException.class,
                () -> new WavFormat(48000, 0, SampleEncoding.PCM_16)).getMessage());
        // block align is a 16-bit field: 8192 channels × 8 bytes = 65536 does not fit
        assertThrows(IllegalArgumentException.class,
                () -> new WavFormat(48000, 8192, SampleEncoding.FLOAT_64));
        // byte rate is a 32-bit field: 2^31−1 Hz × 4 bytes does not fit
        assertThrows(IllegalArgumentException.class,
                () -> new WavFormat(Integer.MAX_VALUE, 2, SampleEncoding.PCM_16));
    }
}
