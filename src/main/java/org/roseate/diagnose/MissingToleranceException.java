package org.roseate.diagnose;

import java.util.List;

/** Some parts have no tolerance, so there is no prior for them; carries their designators. */
public final class MissingToleranceException extends IllegalArgumentException {
    private final List<String> designators;

    public MissingToleranceException(List<String> designators) {
        super("no tolerance for " + String.join(", ", designators));
        this.designators = List.copyOf(designators);
    }

    public List<String> designators() {
        return designators;
    }
}
