/**
 * The sound card: device listing and probing, the real-time playback thread, capture into a ring
 * buffer, and the watchdogs that turn a silent device failure into an error. Java Sound and
 * TarsosDSP are used only here; everything else in Roseate sees {@link org.roseate.noise.FrameSource}
 * going out and blocks of doubles coming in.
 *
 * <p>Sample convention as in {@code org.roseate.io}: doubles at full scale 1.0, interleaved by frame;
 * an n-bit PCM code c maps to c / 2<sup>n−1</sup>.
 *
 * <p>Threads: one render thread per {@link org.roseate.audio.PlaybackEngine} and one capture thread
 * per {@link org.roseate.audio.CaptureEngine} (running TarsosDSP's {@code AudioDispatcher}), each with
 * a watchdog thread beside it. The render and capture loops take no lock of ours, log nothing and
 * touch no file; our code in them allocates nothing (the dispatcher allocates one list iterator per
 * capture block); control reaches them through
 * {@link java.util.concurrent.atomic.AtomicReference} and volatile fields.
 */
package org.roseate.audio;
