package org.roseate.audio;

/** An output line that passes everything through to another and keeps a copy of the bytes written. */
final class RecordingLine implements OutputLine {
    private final OutputLine inner;
    private final byte[] copy;
    private volatile int copied;

    RecordingLine(OutputLine inner, int capacityBytes) {
        this.inner = inner;
        this.copy = new byte[capacityBytes];
    }

    /** The bytes the device accepted, in order (up to the capacity). */
    byte[] bytes() {
        return java.util.Arrays.copyOf(copy, copied);
    }

    @Override
    public String deviceName() {
        return inner.deviceName();
    }

    @Override
    public int sampleRateHz() {
        return inner.sampleRateHz();
    }

    @Override
    public int channels() {
        return inner.channels();
    }

    @Override
    public int bitsPerSample() {
        return inner.bitsPerSample();
    }

    @Override
    public int bufferFrames() {
        return inner.bufferFrames();
    }

    @Override
    public void start() {
        inner.start();
    }

    @Override
    public int write(byte[] bytes, int offset, int length) {
        int n = inner.write(bytes, offset, length);
        int c = copied;
        int keep = Math.max(0, Math.min(n, copy.length - c));
        System.arraycopy(bytes, offset, copy, c, keep);
        copied = c + keep;
        return n;
    }

    @Override
    public long framePosition() {
        return inner.framePosition();
    }

    @Override
    public void close() {
        inner.close();
    }
}
