package org.roseate.cli;

/** Trouble with an audio device: missing, busy, unsupported format, stalled. Exit status 3. */
public class DeviceException extends RuntimeException {
    public DeviceException(String message) {
        super(message);
    }
}
