package org.roseate.digital;

/**
 * An analog model that cannot be turned into a stable digital filter at the requested rate. The
 * message is one line a user can act on; {@link #reason()} lets callers react.
 */
public final class UnrenderableModelException extends IllegalArgumentException {
    private static final long serialVersionUID = 1L;

    /** Why the model was refused. */
    public enum Reason {
        /** a pole or zero or the gain is NaN or infinite */
        NON_FINITE,
        /** gain is exactly zero */
        ZERO_GAIN,
        /** more zeros than poles */
        IMPROPER,
        /** a pole with positive real part */
        RIGHT_HALF_PLANE_POLE,
        /** a pole on the jω axis (including s = 0) */
        POLE_ON_AXIS,
        /** no offered oversampling factor keeps the band levels within tolerance */
        TOLERANCE_NOT_MET
    }

    private final Reason reason;

    public UnrenderableModelException(Reason reason, String message) {
        super(message);
        this.reason = reason;
    }

    public Reason reason() {
        return reason;
    }
}
