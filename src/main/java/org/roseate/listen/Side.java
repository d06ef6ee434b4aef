package org.roseate.listen;

/** One of the two things compared; X is always one of them. */
public enum Side {
    A, B
}
