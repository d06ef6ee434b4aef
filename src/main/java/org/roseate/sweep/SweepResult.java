package org.roseate.sweep;

import java.util.List;

/**
 * What a swept-sine measurement gives.
 *
 * @param spec            the sweep that was played
 * @param points          one per grid frequency, ascending
 * @param latencySeconds  where the reference's impulse lies in the recording, seconds after the
 *                        recording's first sample (the sweep's start plus the path's delay)
 * @param referenceGiven  false when no reference channel was recorded (then H is response/sweep,
 *                        with the bulk delay removed)
 */
public record SweepResult(SweepSpec spec, List<SweepPoint> points, double latencySeconds, boolean referenceGiven) {
    public SweepResult {
        points = List.copyOf(points);
    }
}
