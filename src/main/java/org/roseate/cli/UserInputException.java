package org.roseate.cli;

/** Bad input that is not a design file: arguments, output paths, WAV files. Exit status 2. */
public class UserInputException extends RuntimeException {
    public UserInputException(String message) {
        super(message);
    }
}
