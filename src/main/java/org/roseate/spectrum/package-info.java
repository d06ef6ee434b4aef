/**
 * The analyzer: windows, streaming Welch estimates on JTransforms (power and cross spectral
 * densities), band integration with statistical uncertainty, the H1 transfer estimate with
 * coherence, calibration of the measuring chain, and the noise-source and transfer results that
 * {@code measure} and the window show.
 *
 * <h2>Conventions</h2>
 * <ul>
 *   <li>Samples are at full scale ±1; densities are one-sided, FS²/Hz (scipy.signal.welch
 *       scaling='density'), or V²/Hz after a volts-per-full-scale calibration.</li>
 *   <li>Levels: dBFS = 10·log10(2·P), so a full-scale sine reads 0 dBFS (AES17); dBV re 1 V rms.</li>
 *   <li>Cross densities follow scipy.signal.csd: Gxy = conj(X)·Y, x the reference.</li>
 *   <li>Estimators: {@code prepare} allocates, {@code accept} takes any n and allocates nothing,
 *       {@code snapshot} returns an immutable record. One thread feeds and snapshots; snapshots
 *       may be shared freely.</li>
 * </ul>
 * Depends on {@code bands}, and for the results that compare against targets and designs on
 * {@code compare} and {@code model}; no JavaFX, Java Sound, TarsosDSP or picocli.
 */
package org.roseate.spectrum;
