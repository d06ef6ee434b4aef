package org.roseate.audio;

/**
 * An audio device could not be used: none there, busy, the format refused, or it stopped taking
 * (or giving) data. The message is one line naming the device.
 */
public final class AudioDeviceException extends RuntimeException {
    /** What went wrong, so the caller can suggest the right remedy. */
    public enum Kind {
        /** No device, or none matching the name or index asked for. */
        NO_DEVICE,
        /** The device exists but could not be opened (in use by another program, or refused). */
        BUSY,
        /** The device does not accept the sample rate, channel count or sample format. */
        UNSUPPORTED_FORMAT,
        /** The device stopped making progress while streaming. */
        STALLED
    }

    private final Kind kind;
    private final String device;

    /**
     * @param kind    what went wrong
     * @param device  the device's name as shown by {@code roseate devices}
     * @param message one line, naming the device
     */
    public AudioDeviceException(Kind kind, String device, String message) {
        super(message);
        this.kind = kind;
        this.device = device;
    }

    /** What went wrong. */
    public Kind kind() {
        return kind;
    }

    /** The device's name. */
    public String device() {
        return device;
    }
}
