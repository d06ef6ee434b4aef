package org.roseate.app;

import org.roseate.audio.AudioDeviceException;
import org.roseate.audio.Devices;
import org.roseate.audio.OutputLine;
import org.roseate.audio.PlaybackEngine;
import org.roseate.audio.PlaybackSettings;
import org.roseate.noise.FrameSource;

/**
 * How the window's players (Listen, Bench, the ABX test) start the sound card: an output opened at
 * {@link ListenView#RATE_HZ}, {@link ListenView#CHANNELS} channels and a
 * {@link ListenView#BUFFER_SECONDS} buffer, with the core's playback engine (its ramp from silence)
 * on it, and one way of saying why a start failed.
 */
final class Players {
    private Players() {
    }

    /**
     * Opens {@code device} (null: the default output) and starts playing {@code source}. Blocks
     * while the device opens: call it off the FX thread.
     *
     * @throws AudioDeviceException when the device cannot be opened
     */
    static PlaybackEngine start(String device, FrameSource source) {
        OutputLine line = Devices.openOutput(device, ListenView.RATE_HZ, ListenView.CHANNELS,
                (int) (ListenView.BUFFER_SECONDS * ListenView.RATE_HZ));
        PlaybackEngine e = new PlaybackEngine(line, source, PlaybackSettings.defaults());
        e.start();
        return e;
    }

    /**
     * "Cannot play: …" for a failed start (unwrapping the asynchronous wrapper), with
     * {@code deviceHint} added when the device itself was the trouble.
     */
    static String failure(Throwable ex, String deviceHint) {
        Throwable c = ex.getCause() != null ? ex.getCause() : ex;
        return "Cannot play: " + c.getMessage() + (c instanceof AudioDeviceException ? " (" + deviceHint + ")" : "");
    }
}
