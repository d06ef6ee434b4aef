package org.roseate.io;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.Arrays;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * One test per kind of bad file, checking the one-line message. Files are built field by field
 * after the RIFF/WAVE layout of Microsoft/IBM Multimedia Programming Interface and Data
 * Specifications 1.0 (1991); format tags 2 (Microsoft ADPCM), 6 (A-law), 7 (μ-law) from the
 * Microsoft mmreg.h registry (from memory).
 */
class WavReaderBadFileTest {
    @TempDir
    Path dir;

    /** A minimal valid file: 16-bit mono 8 kHz, 4 frames. */
    private static byte[] good() throws IOException {
        return WavTestSupport.wavBytes(new WavFormat(8000, 1, SampleEncoding.PCM_16),
                new double[] {0, 0.5, -0.5, 0.25});
    }

    private static byte[] fmtChunk(int tag, int channels, int rate, int blockAlign, int bits) {
        ByteBuffer b = ByteBuffer.allocate(24).order(ByteOrder.LITTLE_ENDIAN);
        b.put("fmt ".getBytes(StandardCharsets.US_ASCII)).putInt(16);
        b.putShort((short) tag).putShort((short) channels).putInt(rate)
                .putInt(rate * blockAlign).putShort((short) blockAlign).putShort((short) bits);
        return b.array();
    }

    private static byte[] riff(byte[]... chunks) {
        int n = 4;
        for (byte[] c : chunks) {
            n += c.length;
        }
        ByteBuffer b = ByteBuffer.allocate(8 + n).order(ByteOrder.LITTLE_ENDIAN);
        b.put("RIFF".getBytes(StandardCharsets.US_ASCII)).putInt(n)
                .put("WAVE".getBytes(StandardCharsets.US_ASCII));
        for (byte[] c : chunks) {
            b.put(c);
        }
        return b.array();
    }

    private static byte[] dataChunk(long declared, int actual) {
        ByteBuffer b = ByteBuffer.allocate(8 + actual).order(ByteOrder.LITTLE_ENDIAN);
        b.put("data".getBytes(StandardCharsets.US_ASCII)).putInt((int) declared);
        return b.array();
    }

    private String problem(byte[] bytes) throws IOException {
        Path p = WavTestSupport.writeTemp(dir, "x.wav", bytes);
        WavFormatException e = assertThrows(WavFormatException.class, () -> WavReader.open(p));
        assertEquals(p + ": " + e.problem(), e.getMessage(), "message names the file");
        assertEquals(-1, e.getMessage().indexOf('\n'), "one line");
        return e.problem();
    }

    @Test
    void notRiff() throws IOException {
        byte[] b = good();
        b[0] = 'X';
        assertEquals("not a WAV file (no RIFF header)", problem(b));
        assertEquals("not a WAV file (no RIFF header)",
                problem("ID3\u0004 mp3 data".getBytes(StandardCharsets.US_ASCII)));
        assertEquals("not a WAV file (no RIFF header)", problem(new byte[] {'R', 'I'}));
    }

    @Test
    void emptyFile() throws IOException {
        assertEquals("empty file (0 bytes), not a WAV file", problem(new byte[0]));
    }

    @Test
    void bigEndianAndRf64AreNamed() throws IOException {
        byte[] b = good();
        b[3] = 'X';
        assertEquals("big-endian RIFX files are not supported", problem(b));
        byte[] c = good();
        System.arraycopy("RF64".getBytes(StandardCharsets.US_ASCII), 0, c, 0, 4);
        assertEquals("RF64 (64-bit WAV) files are not supported", problem(c));
    }

    @Test
    void riffButNotWave() throws IOException {
        byte[] b = good();
        System.arraycopy("AVI ".getBytes(StandardCharsets.US_ASCII), 0, b, 8, 4);
        assertEquals("not a WAV file (RIFF form type 'AVI ', expected 'WAVE')", problem(b));
    }

    @Test
    void truncatedHeader() throws IOException {
        assertEquals("truncated header (file is only 10 bytes)",
                problem(Arrays.copyOf(good(), 10)));
        assertEquals("truncated header (file ends inside the fmt chunk)",
                problem(Arrays.copyOf(good(), 30)));
        // 12-byte RIFF header, complete fmt chunk (24), then 5 stray bytes of a chunk header
        assertEquals("truncated header (file ends inside a chunk header at byte 36)",
                problem(Arrays.copyOf(good(), 41)));
    }

    @Test
    void noFmtChunk() throws IOException {
        assertEquals("no fmt chunk", problem(riff(dataChunk(4, 4))));
    }

    @Test
    void noDataChunk() throws IOException {
        assertEquals("no data chunk", problem(riff(fmtChunk(1, 1, 8000, 2, 16))));
    }

    @Test
    void chunkBeforeDataRunsPastTheEnd() throws IOException {
        ByteBuffer list = ByteBuffer.allocate(12).order(ByteOrder.LITTLE_ENDIAN);
        list.put("LIST".getBytes(StandardCharsets.US_ASCII)).putInt(1000);
        assertEquals("truncated: 'LIST' chunk at byte 36 says 1000 bytes, file has 4",
                problem(riff(fmtChunk(1, 1, 8000, 2, 16), list.array())));
    }

    @Test
    void truncatedData() throws IOException {
        assertEquals("truncated: data chunk says 100 bytes, file has 6",
                problem(riff(fmtChunk(1, 1, 8000, 2, 16), dataChunk(100, 6))));
    }

    @Test
    void streamingPlaceholderSizesUseTheFileLength() throws IOException {
        for (long placeholder : new long[] {0, 0xFFFF_FFFFL}) {
            Path p = WavTestSupport.writeTemp(dir, "s.wav",
                    riff(fmtChunk(1, 1, 8000, 2, 16), dataChunk(placeholder, 7)));
            try (WavReader r = WavReader.open(p)) {
                assertEquals(3, r.frames(), "7 bytes = 3 whole 2-byte frames, the odd byte ignored");
            }
        }
    }

    @Test
    void fmtAfterDataIsAccepted() throws IOException {
        byte[] data = dataChunk(4, 4);
        WavTestSupport.le(data).putShort(8, (short) 16384); // first sample 0.5
        Path p = WavTestSupport.writeTemp(dir, "late.wav",
                riff(data, fmtChunk(1, 1, 8000, 2, 16)));
        assertEquals(0.5, WavReader.readAllChannel(p, 0)[0], 0.0);
    }

    @Test
    void unsupportedEncodingsAreNamed() throws IOException {
        String supported = "; supported: PCM 8/16/24/32-bit, float 32/64-bit";
        assertEquals("unsupported encoding (format tag 6, A-law)" + supported,
                problem(riff(fmtChunk(6, 1, 8000, 1, 8), dataChunk(4, 4))));
        assertEquals("unsupported encoding (format tag 7, μ-law)" + supported,
                problem(riff(fmtChunk(7, 1, 8000, 1, 8), dataChunk(4, 4))));
        assertEquals("unsupported encoding (format tag 2, Microsoft ADPCM)" + supported,
                problem(riff(fmtChunk(2, 1, 8000, 256, 4), dataChunk(4, 4))));
        assertEquals("unsupported encoding (format tag 4660)" + supported,
                problem(riff(fmtChunk(0x1234, 1, 8000, 2, 16), dataChunk(4, 4))));
    }

    @Test
    void extensibleWithALawSubFormat() throws IOException {
        byte[] b = WavTestSupport.wavBytes(new WavFormat(8000, 3, SampleEncoding.PCM_16),
                new double[6]);
        b[44] = 6; // SubFormat Data1 (offset 44 in an extensible header) = A-law
        assertEquals("unsupported encoding (extensible, sub-format tag 6, A-law); supported:"
                + " PCM 8/16/24/32-bit, float 32/64-bit", problem(b));
        b[44] = 1;
        b[50] = 0x11; // break the GUID tail
        assertEquals("unsupported encoding (extensible, sub-format GUID is not a KSDATAFORMAT"
                + " one); supported: PCM 8/16/24/32-bit, float 32/64-bit", problem(b));
    }

    @Test
    void zeroChannelsAndZeroRate() throws IOException {
        assertEquals("zero channels", problem(riff(fmtChunk(1, 0, 8000, 2, 16), dataChunk(4, 4))));
        assertEquals("sample rate is 0 Hz",
                problem(riff(fmtChunk(1, 1, 0, 2, 16), dataChunk(4, 4))));
    }

    @Test
    void emptyData() throws IOException {
        assertEquals("no audio frames (data chunk holds 0 bytes, one frame is 2)",
                problem(riff(fmtChunk(1, 1, 8000, 2, 16), dataChunk(0, 0))));
        assertEquals("no audio frames (data chunk holds 3 bytes, one frame is 4)",
                problem(riff(fmtChunk(1, 2, 8000, 4, 16), dataChunk(3, 3))));
    }

    @Test
    void absurdFieldValues() throws IOException {
        assertEquals("unsupported sample size 12 bits for PCM; supported: PCM 8/16/24/32-bit,"
                + " float 32/64-bit", problem(riff(fmtChunk(1, 1, 8000, 2, 12), dataChunk(4, 4))));
        assertEquals("unsupported sample size 16 bits for IEEE float; supported: PCM"
                + " 8/16/24/32-bit, float 32/64-bit",
                problem(riff(fmtChunk(3, 1, 8000, 2, 16), dataChunk(4, 4))));
        assertEquals("block align 3 does not match channels × bytes per sample (2 × 2 = 4)",
                problem(riff(fmtChunk(1, 2, 8000, 3, 16), dataChunk(4, 4))));
        byte[] hugeRate = riff(fmtChunk(1, 1, 0, 2, 16), dataChunk(4, 4));
        WavTestSupport.le(hugeRate).putInt(24, 0xF000_0000); // 4026531840 Hz
        assertEquals("sample rate 4026531840 Hz is out of range", problem(hugeRate));
        byte[] shortFmt = riff(fmtChunk(1, 1, 8000, 2, 16), dataChunk(4, 4));
        WavTestSupport.le(shortFmt).putInt(16, 14);
        assertEquals("fmt chunk too short (14 bytes, need at least 16)", problem(shortFmt));
    }

    @Test
    void extensibleFieldChecks() throws IOException {
        byte[] b = WavTestSupport.wavBytes(new WavFormat(8000, 3, SampleEncoding.PCM_16),
                new double[6]);
        WavTestSupport.le(b).putShort(38, (short) 20); // valid bits > 16-bit container
        assertEquals("extensible fmt chunk has 20 valid bits in a 16-bit container", problem(b));
        WavTestSupport.le(b).putShort(38, (short) 12).putShort(36, (short) 0);
        assertEquals("extensible fmt chunk has cbSize 0, need 22", problem(b));
        byte[] plain = riff(fmtChunk(0xFFFE, 1, 8000, 2, 16), dataChunk(4, 4));
        assertEquals("extensible fmt chunk too short (16 bytes, need 40)", problem(plain));
    }

    @Test
    void validBitsBelowTheContainerAreRead() throws IOException {
        byte[] b = WavTestSupport.wavBytes(new WavFormat(8000, 3, SampleEncoding.PCM_16),
                new double[] {0.5, -0.5, 0.25, 0, 0, 0});
        WavTestSupport.le(b).putShort(38, (short) 12); // 12 valid bits in 16, as Microsoft allows
        Path p = WavTestSupport.writeTemp(dir, "v.wav", b);
        assertEquals(0.25, WavReader.readAllChannel(p, 2)[0], 0.0);
    }

    @Test
    void missingFileIsAnIoException() {
        assertThrows(NoSuchFileException.class, () -> WavReader.open(dir.resolve("none.wav")));
    }

    @Test
    void fileThatShrinksWhileReadingIsReported() throws IOException {
        Path p = WavTestSupport.writeTemp(dir, "g.wav", good());
        try (WavReader r = WavReader.open(p)) {
            Files.write(p, Arrays.copyOf(good(), 46)); // cut to one sample after the header
            double[] buf = new double[4];
            WavFormatException e = assertThrows(WavFormatException.class, () -> r.readFrames(buf, 4));
            assertEquals("truncated: file ended at byte 46 while reading samples", e.problem());
        }
    }
}
