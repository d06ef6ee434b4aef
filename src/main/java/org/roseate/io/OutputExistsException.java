package org.roseate.io;

import java.nio.file.Path;

/** An output file already exists and the caller did not ask to replace it. */
public final class OutputExistsException extends RuntimeException {
    private final transient Path target;

    /** @param target the existing file, named in the message as given */
    public OutputExistsException(Path target) {
        super(target + " already exists; add --force to replace it");
        this.target = target;
    }

    /** The file that already exists. */
    public Path target() {
        return target;
    }
}
