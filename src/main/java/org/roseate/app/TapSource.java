package org.roseate.app;

import org.roseate.noise.FrameSource;

/**
 * A {@link FrameSource} that renders another source and copies one channel of what it rendered
 * into a {@link MeterRing} for the band meter, while it is the ring's active tap. It adds only a
 * copy to the render thread's work: no allocation, lock or wait.
 */
final class TapSource implements FrameSource {
    private final FrameSource inner;
    private final MeterRing ring;
    private final int id;

    /**
     * @param id this tap's id; it writes while {@code ring.activeTap() == id}
     */
    TapSource(FrameSource inner, MeterRing ring, int id) {
        this.inner = inner;
        this.ring = ring;
        this.id = id;
    }

    int id() {
        return id;
    }

    FrameSource inner() {
        return inner;
    }

    @Override
    public int channels() {
        return inner.channels();
    }

    @Override
    public double sampleRateHz() {
        return inner.sampleRateHz();
    }

    @Override
    public void render(double[] interleaved, int frames) {
        inner.render(interleaved, frames);
        if (ring.activeTap() == id) {
            ring.write(interleaved, frames, inner.channels(), 0);
        }
    }
}
