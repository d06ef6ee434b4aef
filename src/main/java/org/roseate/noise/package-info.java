/**
 * Noise generation and level handling, plain Java: the seeded white source
 * ({@link org.roseate.noise.WhiteNoiseSource}), the ideal fractional-slope reference
 * ({@link org.roseate.noise.IdealPink}), level setting from a filter's noise power gain
 * ({@link org.roseate.noise.LevelCalculator}), streaming signal statistics
 * ({@link org.roseate.noise.SignalStatistics}) and an optional soft limiter
 * ({@link org.roseate.noise.SoftLimiter}).
 *
 * <p>Amplitudes are in full-scale units (1.0 = full scale); levels in dBFS follow AES17
 * (a full-scale sine reads 0 dBFS). Frequencies are in Hz; {@link org.roseate.model.Zpk} roots
 * are in rad/s.
 */
package org.roseate.noise;
