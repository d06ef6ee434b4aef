package org.roseate.io;

import java.io.Closeable;
import java.io.IOException;
import java.lang.invoke.MethodHandles;
import java.lang.invoke.VarHandle;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.channels.FileChannel;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;

/**
 * Streams samples out of a RIFF/WAVE file for analysis, in constant memory.
 *
 * <p>Reads little-endian RIFF/WAVE (Microsoft/IBM, Multimedia Programming Interface and Data
 * Specifications 1.0, 1991) with format tag 1 (PCM 8/16/24/32-bit), tag 3 (IEEE float 32/64-bit)
 * or tag 0xFFFE (WAVE_FORMAT_EXTENSIBLE, per Microsoft's documentation) with a PCM or IEEE float
 * sub-format; for extensible files the container size decides the encoding and valid bits below it
 * are accepted. Chunks other than "fmt " and "data" (LIST, fact, cue, ...) are skipped, honouring
 * the pad byte after odd-sized chunks.
 *
 * <p>Samples are normalised to full scale: an n-bit PCM code c becomes c / 2<sup>n−1</sup>, so
 * values lie in [−1, 1); 8-bit codes are unsigned, (b − 128) / 128. Float samples are returned
 * unchanged (they may exceed ±1 or be NaN).
 *
 * <p><b>Sizes.</b> A data chunk whose size field is 0 or 0xFFFFFFFF (left by recorders that
 * stream and never patch the header) is taken to run to the end of the file. Any other size
 * larger than the rest of the file is reported as truncation. A trailing partial frame is ignored.
 * The header fields and the RIFF size are never trusted for allocation: memory use is bounded
 * whatever the bytes say, and any byte sequence yields either a reader, a
 * {@link WavFormatException} or an {@link IOException}.
 *
 * <p>Not thread-safe.
 */
public final class WavReader implements Closeable {
    private static final String SUPPORTED = "supported: PCM 8/16/24/32-bit, float 32/64-bit";
    private static final int BUFFER_BYTES = 1 << 16;
    /** Little-endian views of the byte buffer: one load per sample, compiled to a plain memory read. */
    private static final VarHandle LE_SHORT = MethodHandles.byteArrayViewVarHandle(short[].class, ByteOrder.LITTLE_ENDIAN);
    private static final VarHandle LE_INT = MethodHandles.byteArrayViewVarHandle(int[].class, ByteOrder.LITTLE_ENDIAN);
    private static final VarHandle LE_FLOAT = MethodHandles.byteArrayViewVarHandle(float[].class, ByteOrder.LITTLE_ENDIAN);
    private static final VarHandle LE_DOUBLE = MethodHandles.byteArrayViewVarHandle(double[].class, ByteOrder.LITTLE_ENDIAN);
    private static final int FMT_READ_BYTES = 40;

    private final Path file;
    private final FileChannel channel;
    private final WavFormat format;
    private final long dataOffset;
    private final long frames;
    private final ByteBuffer buffer;
    private final int framesPerBuffer;
    private long framesRead;

    private WavReader(Path file, FileChannel channel, WavFormat format, long dataOffset,
            long frames) {
        this.file = file;
        this.channel = channel;
        this.format = format;
        this.dataOffset = dataOffset;
        this.frames = frames;
        this.framesPerBuffer = Math.max(1, BUFFER_BYTES / format.bytesPerFrame());
        this.buffer = ByteBuffer.allocate(framesPerBuffer * format.bytesPerFrame());
    }

    /**
     * Opens a WAV file and reads its header.
     *
     * @throws WavFormatException if the file is not a readable WAV file; the message names it
     * @throws IOException        if the file cannot be opened or read
     */
    public static WavReader open(Path file) throws IOException {
        FileChannel ch = FileChannel.open(file, StandardOpenOption.READ);
        try {
            return new HeaderParser(file, ch).parse();
        } catch (RuntimeException | IOException | Error e) {
            ch.close();
            throw e;
        }
    }

    /** The file's rate, channels and encoding. */
    public WavFormat format() {
        return format;
    }

    /** Frames in the data chunk (≥ 1). */
    public long frames() {
        return frames;
    }

    /** Frames not yet read. */
    public long remainingFrames() {
        return frames - framesRead;
    }

    /**
     * Reads up to maxFrames frames into the start of an interleaved array, at full scale 1.0.
     * Allocates nothing.
     *
     * @param interleaved receives frames × channels samples; at least maxFrames × channels long
     * @param maxFrames   the most frames to read, ≥ 0
     * @return frames read: maxFrames, fewer at the end of the data, 0 once it is exhausted
     * @throws IllegalArgumentException if maxFrames is negative or the array too short
     * @throws WavFormatException       if the file shrank under the reader
     */
    public int readFrames(double[] interleaved, int maxFrames) throws IOException {
        int channels = format.channels();
        if (maxFrames < 0 || (long) maxFrames * channels > interleaved.length) {
            throw new IllegalArgumentException("maxFrames=" + maxFrames + " with " + channels
                    + " channels needs " + (long) maxFrames * channels + " samples; array has "
                    + interleaved.length);
        }
        int total = (int) Math.min(maxFrames, frames - framesRead);
        int done = 0;
        while (done < total) {
            int n = Math.min(framesPerBuffer, total - done);
            fill(n * format.bytesPerFrame());
            decode(interleaved, done * channels, n * channels);
            done += n;
            framesRead += n;
        }
        return total;
    }

    private void fill(int bytes) throws IOException {
        buffer.clear().limit(bytes);
        long position = dataOffset + framesRead * format.bytesPerFrame();
        while (buffer.hasRemaining()) {
            int r = channel.read(buffer, position + buffer.position());
            if (r < 0) {
                throw new WavFormatException(file, "truncated: file ended at byte "
                        + (position + buffer.position()) + " while reading samples");
            }
        }
    }

    private void decode(double[] dst, int from, int samples) {
        byte[] b = buffer.array();
        int end = from + samples;
        int p = 0;
        switch (format.encoding()) {
            case PCM_8 -> {
                for (int i = from; i < end; i++) {
                    dst[i] = ((b[p++] & 0xFF) - 128) * 0x1p-7;
                }
            }
            case PCM_16 -> {
                for (int i = from; i < end; i++) {
                    dst[i] = (short) LE_SHORT.get(b, p) * 0x1p-15;
                    p += 2;
                }
            }
            case PCM_24 -> {
                for (int i = from; i < end; i++) {
                    dst[i] = ((b[p] & 0xFF) | (b[p + 1] & 0xFF) << 8 | b[p + 2] << 16) * 0x1p-23;
                    p += 3;
                }
            }
            case PCM_32 -> {
                for (int i = from; i < end; i++) {
                    dst[i] = (int) LE_INT.get(b, p) * 0x1p-31;
                    p += 4;
                }
            }
            case FLOAT_32 -> {
                for (int i = from; i < end; i++) {
                    dst[i] = (float) LE_FLOAT.get(b, p);
                    p += 4;
                }
            }
            case FLOAT_64 -> {
                for (int i = from; i < end; i++) {
                    dst[i] = (double) LE_DOUBLE.get(b, p);
                    p += 8;
                }
            }
        }
    }

    private static int int32(byte[] b, int p) {
        return (b[p] & 0xFF) | (b[p + 1] & 0xFF) << 8 | (b[p + 2] & 0xFF) << 16 | b[p + 3] << 24;
    }

    /** Closes the file. */
    @Override
    public void close() throws IOException {
        channel.close();
    }

    /**
     * Reads one channel of a whole file into memory; meant for small files (tests, short captures).
     *
     * @param channel zero-based channel index
     * @throws IllegalArgumentException if the channel does not exist or the file has more than
     *                                  2^31 − 16 frames
     * @throws WavFormatException       if the file is not a readable WAV file
     */
    public static double[] readAllChannel(Path file, int channel) throws IOException {
        try (WavReader r = open(file)) {
            int channels = r.format().channels();
            if (channel < 0 || channel >= channels) {
                throw new IllegalArgumentException("channel=" + channel + " is out of range for "
                        + file + " (" + channels + " channels)");
            }
            if (r.frames() > Integer.MAX_VALUE - 16) {
                throw new IllegalArgumentException(file + " has " + r.frames()
                        + " frames, too many to hold in one array");
            }
            double[] out = new double[(int) r.frames()];
            int block = Math.max(1, 4096 / channels);
            double[] buf = new double[block * channels];
            int at = 0;
            for (int n; (n = r.readFrames(buf, block)) > 0; ) {
                for (int i = 0; i < n; i++) {
                    out[at + i] = buf[i * channels + channel];
                }
                at += n;
            }
            return out;
        }
    }

    /** Walks the chunks of a RIFF/WAVE file; every read is bounded by the file's real length. */
    private static final class HeaderParser {
        private final Path file;
        private final FileChannel ch;
        private final long length;
        private final byte[] b = new byte[FMT_READ_BYTES];

        HeaderParser(Path file, FileChannel ch) throws IOException {
            this.file = file;
            this.ch = ch;
            this.length = ch.size();
        }

        WavReader parse() throws IOException {
            if (length == 0) {
                throw fail("empty file (0 bytes), not a WAV file");
            }
            int head = (int) Math.min(12, length);
            read(0, head);
            String riff = tag(0, head);
            if (!riff.equals("RIFF")) {
                throw fail(switch (riff) {
                    case "RIFX" -> "big-endian RIFX files are not supported";
                    case "RF64" -> "RF64 (64-bit WAV) files are not supported";
                    default -> "not a WAV file (no RIFF header)";
                });
            }
            if (head < 12) {
                throw fail("truncated header (file is only " + length + " bytes)");
            }
            String form = tag(8, 12);
            if (!form.equals("WAVE")) {
                throw fail("not a WAV file (RIFF form type '" + form + "', expected 'WAVE')");
            }
            WavFormat format = null;
            long dataStart = -1;
            long dataSize = 0;
            String overrun = null;
            long pos = 12;
            while (pos <= length - 8) {
                read(pos, 8);
                String id = tag(0, 4);
                long size = u32(4);
                long body = pos + 8;
                if (id.equals("fmt ") && format == null) {
                    format = parseFmt(body, size);
                    if (dataStart >= 0) {
                        break;
                    }
                } else if (id.equals("data") && dataStart < 0) {
                    dataStart = body;
                    dataSize = size;
                    if (format != null || isPlaceholder(size)) {
                        break;
                    }
                }
                if (size > length - body) {
                    overrun = "'" + id + "' chunk at byte " + pos + " says " + size
                            + " bytes, file has " + (length - body);
                    break;
                }
                pos = body + size + (size & 1);
            }
            if (format == null) {
                throw fail(overrun != null ? "truncated: " + overrun
                        : pos < length && pos > length - 8 ? truncatedChunkHeader(pos)
                        : "no fmt chunk");
            }
            if (dataStart < 0) {
                throw fail(overrun != null ? "truncated: " + overrun
                        : pos < length ? truncatedChunkHeader(pos)
                        : "no data chunk");
            }
            long available = length - dataStart;
            long dataBytes;
            if (isPlaceholder(dataSize)) {
                dataBytes = available;
            } else if (dataSize > available) {
                throw fail("truncated: data chunk says " + dataSize + " bytes, file has "
                        + available);
            } else {
                dataBytes = dataSize;
            }
            long frames = dataBytes / format.bytesPerFrame();
            if (frames == 0) {
                throw fail("no audio frames (data chunk holds " + dataBytes + " bytes, one frame is "
                        + format.bytesPerFrame() + ")");
            }
            return new WavReader(file, ch, format, dataStart, frames);
        }

        private String truncatedChunkHeader(long pos) {
            return "truncated header (file ends inside a chunk header at byte " + pos + ")";
        }

        private static boolean isPlaceholder(long size) {
            return size == 0 || size == WavFormat.MAX_UINT32;
        }

        private WavFormat parseFmt(long body, long size) throws IOException {
            if (size < 16) {
                throw fail("fmt chunk too short (" + size + " bytes, need at least 16)");
            }
            int n = (int) Math.min(size, FMT_READ_BYTES);
            if (n > length - body) {
                throw fail("truncated header (file ends inside the fmt chunk)");
            }
            read(body, n);
            int tag = u16(0);
            int channels = u16(2);
            long rate = u32(4);
            int blockAlign = u16(12);
            int bits = u16(14);
            int sampleTag = tag;
            if (tag == WavCodes.TAG_EXTENSIBLE) {
                if (n < 40) {
                    throw fail("extensible fmt chunk too short (" + size + " bytes, need 40)");
                }
                int cbSize = u16(16);
                if (cbSize < 22) {
                    throw fail("extensible fmt chunk has cbSize " + cbSize + ", need 22");
                }
                int validBits = u16(18);
                if (validBits > bits) {
                    throw fail("extensible fmt chunk has " + validBits + " valid bits in a "
                            + bits + "-bit container");
                }
                sampleTag = WavCodes.subFormatTag(b, 24);
                if (sampleTag < 0) {
                    throw fail("unsupported encoding (extensible, sub-format GUID is not a"
                            + " KSDATAFORMAT one); " + SUPPORTED);
                }
                if (sampleTag != WavCodes.TAG_PCM && sampleTag != WavCodes.TAG_IEEE_FLOAT) {
                    throw fail("unsupported encoding (extensible, sub-format tag "
                            + describeTag(sampleTag) + "); " + SUPPORTED);
                }
            } else if (tag != WavCodes.TAG_PCM && tag != WavCodes.TAG_IEEE_FLOAT) {
                throw fail("unsupported encoding (format tag " + describeTag(tag) + "); "
                        + SUPPORTED);
            }
            if (channels == 0) {
                throw fail("zero channels");
            }
            if (rate == 0) {
                throw fail("sample rate is 0 Hz");
            }
            if (rate > Integer.MAX_VALUE) {
                throw fail("sample rate " + rate + " Hz is out of range");
            }
            SampleEncoding encoding = encodingOf(sampleTag, bits);
            int expectedAlign = channels * encoding.bytesPerSample();
            if (blockAlign != expectedAlign) {
                throw fail("block align " + blockAlign + " does not match channels × bytes per"
                        + " sample (" + channels + " × " + encoding.bytesPerSample() + " = "
                        + expectedAlign + ")");
            }
            try {
                return new WavFormat((int) rate, channels, encoding);
            } catch (IllegalArgumentException e) {
                throw fail(e.getMessage());
            }
        }

        private SampleEncoding encodingOf(int sampleTag, int bits) {
            if (sampleTag == WavCodes.TAG_PCM) {
                switch (bits) {
                    case 8: return SampleEncoding.PCM_8;
                    case 16: return SampleEncoding.PCM_16;
                    case 24: return SampleEncoding.PCM_24;
                    case 32: return SampleEncoding.PCM_32;
                    default: break;
                }
            } else {
                switch (bits) {
                    case 32: return SampleEncoding.FLOAT_32;
                    case 64: return SampleEncoding.FLOAT_64;
                    default: break;
                }
            }
            throw fail("unsupported sample size " + bits + " bits for "
                    + WavCodes.tagName(sampleTag) + "; " + SUPPORTED);
        }

        private static String describeTag(int tag) {
            String name = WavCodes.tagName(tag);
            return name.isEmpty() ? String.valueOf(tag) : tag + ", " + name;
        }

        private WavFormatException fail(String problem) {
            return new WavFormatException(file, problem);
        }

        private void read(long position, int n) throws IOException {
            ByteBuffer buf = ByteBuffer.wrap(b, 0, n);
            while (buf.hasRemaining()) {
                if (ch.read(buf, position + buf.position()) < 0) {
                    throw fail("truncated header (file ended at byte "
                            + (position + buf.position()) + ")");
                }
            }
        }

        /** Four bytes as text, non-printable ones shown as '?', so messages stay one clean line. */
        private String tag(int from, int to) {
            StringBuilder s = new StringBuilder(4);
            for (int i = from; i < Math.min(to, from + 4); i++) {
                int c = b[i] & 0xFF;
                s.append(c >= 0x20 && c < 0x7F ? (char) c : '?');
            }
            return s.toString();
        }

        private int u16(int p) {
            return (b[p] & 0xFF) | (b[p + 1] & 0xFF) << 8;
        }

        private long u32(int p) {
            return int32(b, p) & 0xFFFF_FFFFL;
        }
    }
}
