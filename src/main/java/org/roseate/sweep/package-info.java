/**
 * Transfer measurement with an exponential swept sine (Farina's method: A. Farina, "Simultaneous
 * measurement of impulse response and distortion with a swept-sine technique", AES 108th
 * Convention, 2000, preprint 5093).
 *
 * <p>{@link org.roseate.sweep.SweepSpec} describes the sweep (start and end frequency, duration,
 * fades, rate) and renders it; {@link org.roseate.sweep.SweepSource} plays it as a
 * {@link org.roseate.noise.FrameSource}; {@link org.roseate.sweep.SweepAnalyzer} deconvolves a
 * recorded reference channel and response channel and gives {@link org.roseate.sweep.SweepResult}:
 * |H| and phase of response/reference on a logarithmic frequency grid, the 2nd and 3rd harmonic
 * responses separated in time, and each figure's bound from the measured noise floor.
 *
 * <p>Plain Java on JTransforms: no JavaFX, Java Sound, TarsosDSP or picocli.
 */
package org.roseate.sweep;
