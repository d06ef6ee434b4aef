package org.roseate.audio;

import java.io.IOException;
import java.io.OutputStream;
import java.io.UncheckedIOException;
import java.util.function.ObjIntConsumer;
import org.roseate.io.WavFormat;
import org.roseate.io.WavWriter;

/**
 * A capture consumer that writes what comes in to a WAV file through {@link WavWriter}: the first
 * {@code totalFrames} frames are kept, later ones ignored, and {@link #finish()} fills a short
 * capture up with silence so the header's frame count holds. Run it through
 * {@link CaptureEngine#deliverTo}, on the delivery thread, never on the capture thread.
 *
 * <p>Captured samples are exact multiples of an LSB of the line's format, so writing them at the
 * same bit depth without dither stores them unchanged.
 */
public final class WavCaptureSink implements ObjIntConsumer<double[]> {
    private final WavWriter writer;
    private final int channels;
    private final long totalFrames;
    private long kept;
    private long received;

    /**
     * @param out         the file's stream (not closed here)
     * @param format      rate, channels and encoding of the file; the channels must match the capture
     * @param totalFrames frames to keep, ≥ 0
     */
    public WavCaptureSink(OutputStream out, WavFormat format, long totalFrames) throws IOException {
        this.writer = WavWriter.withoutDither(out, format, totalFrames);
        this.channels = format.channels();
        this.totalFrames = totalFrames;
    }

    @Override
    public void accept(double[] interleaved, int frames) {
        received += frames;
        int take = (int) Math.min(frames, totalFrames - kept);
        if (take <= 0) {
            return;
        }
        try {
            writer.writeFrames(interleaved, take);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        kept += take;
    }

    /**
     * Pads with silence up to the declared length and finishes the file.
     *
     * @return frames that came from the capture (the rest of the file is padding)
     */
    public long finish() throws IOException {
        long captured = kept;
        double[] zeros = new double[1024 * channels];
        while (kept < totalFrames) {
            int n = (int) Math.min(1024, totalFrames - kept);
            writer.writeFrames(zeros, n);
            kept += n;
        }
        writer.finish();
        return captured;
    }

    /** Frames offered so far, kept or not. */
    public long framesReceived() {
        return received;
    }
}
