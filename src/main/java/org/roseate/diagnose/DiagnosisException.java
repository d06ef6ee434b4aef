package org.roseate.diagnose;

/** The measurement cannot support a diagnosis (too few trusted points, a band that misses the parts). */
public final class DiagnosisException extends IllegalArgumentException {
    public DiagnosisException(String message) {
        super(message);
    }
}
