/**
 * The one measurement pipeline: a {@link org.roseate.measure.MeasureRequest} and a stream of
 * interleaved frames (a WAV file or a sound-card input) go through
 * {@link org.roseate.measure.MeasurePipeline} to an immutable
 * {@link org.roseate.measure.MeasureResult}: input integrity (silence, NaN, clipping, DC),
 * band levels by Welch or the time-domain filter bank, calibration, and the derived figures with
 * their uncertainty. {@link org.roseate.measure.MeasureCsv}, {@link org.roseate.measure.MeasureJson}
 * and {@link org.roseate.measure.MeasureTable} are the only writers; the command line, the window
 * and {@code compare} are adapters around them. Plain Java: no JavaFX, Java Sound, TarsosDSP or
 * picocli imports.
 */
package org.roseate.measure;
