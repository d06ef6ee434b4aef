package org.roseate.spectrum;

/** A calibration file that cannot be used; the message is one line, "file: problem". */
public final class CalibrationException extends RuntimeException {
    /**
     * @param source  the calibration's file name, as shown to the user
     * @param problem what is wrong
     */
    public CalibrationException(String source, String problem) {
        super(source + ": " + problem);
    }
}
