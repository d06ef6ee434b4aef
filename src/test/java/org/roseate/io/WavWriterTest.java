package org.roseate.io;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.nio.ByteBuffer;
import java.util.Arrays;
import org.junit.jupiter.api.Test;

/**
 * Header bytes by offset, clipping, the frame-count contract. Offsets and field meanings:
 * Microsoft/IBM Multimedia Programming Interface and Data Specifications 1.0 (1991), WAVE form
 * ("fmt " chunk = wFormatTag, nChannels, nSamplesPerSec, nAvgBytesPerSec, nBlockAlign,
 * wBitsPerSample; "fact" chunk = dwSampleLength); extensible fields per Microsoft's
 * WAVEFORMATEXTENSIBLE documentation (cbSize 22, wValidBitsPerSample, dwChannelMask, SubFormat).
 */
class WavWriterTest {
    @Test
    void stereo16BitHasTheCanonical44ByteHeader() throws IOException {
        byte[] b = WavTestSupport.wavBytes(new WavFormat(48000, 2, SampleEncoding.PCM_16),
                new double[2 * 10]);
        ByteBuffer h = WavTestSupport.le(b);
        assertEquals(44 + 40, b.length);
        assertEquals("RIFF", WavTestSupport.tag(b, 0));
        assertEquals(b.length - 8, h.getInt(4), "RIFF size = file length − 8");
        assertEquals("WAVE", WavTestSupport.tag(b, 8));
        assertEquals("fmt ", WavTestSupport.tag(b, 12));
        assertEquals(16, h.getInt(16));
        assertEquals(1, h.getShort(20), "WAVE_FORMAT_PCM");
        assertEquals(2, h.getShort(22));
        assertEquals(48000, h.getInt(24));
        assertEquals(48000 * 4, h.getInt(28), "nAvgBytesPerSec = rate × block align");
        assertEquals(4, h.getShort(32), "nBlockAlign = channels × bytes per sample");
        assertEquals(16, h.getShort(34));
        assertEquals("data", WavTestSupport.tag(b, 36));
        assertEquals(40, h.getInt(40));
    }

    @Test
    void floatHasTag3WithCbSizeAndFactChunk() throws IOException {
        byte[] b = WavTestSupport.wavBytes(new WavFormat(96000, 1, SampleEncoding.FLOAT_32),
                new double[7]);
        ByteBuffer h = WavTestSupport.le(b);
        assertEquals(18, h.getInt(16), "WAVEFORMATEX with cbSize");
        assertEquals(3, h.getShort(20), "WAVE_FORMAT_IEEE_FLOAT");
        assertEquals(32, h.getShort(34));
        assertEquals(0, h.getShort(36), "cbSize");
        assertEquals("fact", WavTestSupport.tag(b, 38));
        assertEquals(4, h.getInt(42));
        assertEquals(7, h.getInt(46), "dwSampleLength = frames");
        assertEquals("data", WavTestSupport.tag(b, 50));
        assertEquals(28, h.getInt(54));
        assertEquals(58 + 28, b.length);
        assertEquals(b.length - 8, h.getInt(4));
    }

    @Test
    void sixChannelsUseExtensibleWithPcmSubFormat() throws IOException {
        byte[] b = WavTestSupport.wavBytes(new WavFormat(48000, 6, SampleEncoding.PCM_24),
                new double[6 * 3]);
        ByteBuffer h = WavTestSupport.le(b);
        assertEquals(40, h.getInt(16));
        assertEquals((short) 0xFFFE, h.getShort(20), "WAVE_FORMAT_EXTENSIBLE");
        assertEquals(6, h.getShort(22));
        assertEquals(18, h.getShort(32));
        assertEquals(24, h.getShort(34), "container bits");
        assertEquals(22, h.getShort(36), "cbSize");
        assertEquals(24, h.getShort(38), "valid bits");
        assertEquals(0, h.getInt(40), "channel mask: no speaker assignment");
        // KSDATAFORMAT_SUBTYPE_PCM {00000001-0000-0010-8000-00AA00389B71}, Data1..3 little-endian
        byte[] pcmGuid = {1, 0, 0, 0, 0, 0, 0x10, 0, (byte) 0x80, 0, 0, (byte) 0xAA, 0, 0x38,
            (byte) 0x9B, 0x71};
        assertArrayEquals(pcmGuid, Arrays.copyOfRange(b, 44, 60));
        assertEquals("data", WavTestSupport.tag(b, 60));
        assertEquals(54, h.getInt(64));
        assertEquals(b.length - 8, h.getInt(4));
    }

    @Test
    void extensibleFloatHasFloatSubFormatAndFact() throws IOException {
        byte[] b = WavTestSupport.wavBytes(new WavFormat(48000, 3, SampleEncoding.FLOAT_64),
                new double[3 * 2]);
        ByteBuffer h = WavTestSupport.le(b);
        assertEquals(3, h.getInt(44), "KSDATAFORMAT_SUBTYPE_IEEE_FLOAT Data1 = 3");
        assertEquals("fact", WavTestSupport.tag(b, 60));
        assertEquals(2, h.getInt(68));
    }

    @Test
    void oddDataSizeGetsThePadByteCountedInRiffSize() throws IOException {
        byte[] b = WavTestSupport.wavBytes(new WavFormat(8000, 1, SampleEncoding.PCM_8),
                new double[5]);
        ByteBuffer h = WavTestSupport.le(b);
        assertEquals(5, h.getInt(40), "data size excludes the pad");
        assertEquals(44 + 5 + 1, b.length, "RIFF: odd chunks are followed by one pad byte");
        assertEquals(b.length - 8, h.getInt(4));
        assertEquals((byte) 128, b[44], "8-bit silence is 128");
        assertEquals(0, b[b.length - 1]);
    }

    @Test
    void clippingIsCountedOnTheRoundedCode() throws IOException {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        WavFormat f = new WavFormat(48000, 1, SampleEncoding.PCM_16);
        WavWriter w = WavWriter.withoutDither(out, f, 7);
        // 16-bit full scale F = 32768, codes −32768..32767 (class notes of WavWriter)
        double[] x = {
            -1.0,                 // −32768: in range
            32767.49 / 32768,     // rounds to 32767: in range
            32767.5 / 32768,      // rounds (half to even) to 32768: clipped
            1.0,                  // 32768: clipped to 32767
            -32768.6 / 32768,     // rounds to −32769: clipped
            Double.NaN,           // written as 0, counted
            1e300                 // clipped
        };
        w.writeFrames(x, 7);
        w.finish();
        assertEquals(5, w.clippedSamples(), "entries 3 to 7");
        ByteBuffer h = WavTestSupport.le(out.toByteArray());
        short[] codes = new short[7];
        for (int i = 0; i < 7; i++) {
            codes[i] = h.getShort(44 + 2 * i);
        }
        assertArrayEquals(new short[] {-32768, 32767, 32767, 32767, -32768, 0, 32767}, codes);
    }

    @Test
    void ditherIsOffForFloatAndNothingClipsThere() throws IOException {
        WavWriter w = new WavWriter(new ByteArrayOutputStream(),
                new WavFormat(48000, 1, SampleEncoding.FLOAT_32), 1, 1L);
        assertFalse(w.dithered());
        w.writeFrames(new double[] {5.0}, 1);
        assertEquals(0, w.clippedSamples());
    }

    @Test
    void frameCountContractIsEnforced() throws IOException {
        WavFormat f = new WavFormat(48000, 2, SampleEncoding.PCM_16);
        WavWriter w = WavWriter.withoutDither(new ByteArrayOutputStream(), f, 3);
        w.writeFrames(new double[4], 2);
        assertEquals("WAV writer got 2 of the 3 frames declared in its header",
                assertThrows(IllegalStateException.class, w::finish).getMessage());
        assertEquals("writing 2 more frames would exceed the 3 declared (2 written)",
                assertThrows(IllegalStateException.class, () -> w.writeFrames(new double[4], 2))
                        .getMessage());
        assertEquals("frames=3 with 2 channels needs 6 samples; array has 4",
                assertThrows(IllegalArgumentException.class, () -> w.writeFrames(new double[4], 3))
                        .getMessage());
        w.writeFrames(new double[2], 1);
        w.writeFrames(new double[0], 0);
        w.finish();
        assertThrows(IllegalStateException.class, () -> w.writeFrames(new double[2], 1));
        assertEquals("totalFrames=-1 must be >= 0", assertThrows(IllegalArgumentException.class,
                () -> WavWriter.withoutDither(new ByteArrayOutputStream(), f, -1)).getMessage());
        // RIFF sizes are 32-bit: 2^30 stereo 16-bit frames are 4 GiB of data
        assertThrows(IllegalArgumentException.class,
                () -> WavWriter.withoutDither(new ByteArrayOutputStream(), f, 1L << 30));
    }

    @Test
    void sameSeedSameBytesOtherSeedOtherBytes() throws IOException {
        WavFormat f = new WavFormat(44100, 1, SampleEncoding.PCM_16);
        double[] x = new double[1000];
        Arrays.fill(x, 0.1);
        assertArrayEquals(dithered(f, x, 7), dithered(f, x, 7));
        assertFalse(Arrays.equals(dithered(f, x, 7), dithered(f, x, 8)));
    }

    private static byte[] dithered(WavFormat f, double[] x, long seed) throws IOException {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        WavWriter w = new WavWriter(out, f, x.length, seed);
        w.writeFrames(x, x.length);
        w.finish();
        return out.toByteArray();
    }
}
