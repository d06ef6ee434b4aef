package org.roseate.io;

import java.nio.file.Path;

/**
 * A file that is not a WAV file this package can read. The message is one line, "file: problem",
 * fit to show a user as is.
 */
public final class WavFormatException extends RuntimeException {
    private final transient Path file;
    private final String problem;

    /**
     * @param file    the file, named in the message as given
     * @param problem what is wrong, without the file name
     */
    public WavFormatException(Path file, String problem) {
        super(file + ": " + problem);
        this.file = file;
        this.problem = problem;
    }

    /** The file that could not be read. */
    public Path file() {
        return file;
    }

    /** What is wrong, without the file name. */
    public String problem() {
        return problem;
    }
}
