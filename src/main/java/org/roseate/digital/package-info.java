/**
 * The digital path: from an analog {@link org.roseate.model.Zpk} to a running filter.
 *
 * <pre>
 * Zpk (s, rad/s) ──► Bilinear.discretize (PrewarpRule) ──► DigitalZpk ──► SosDesign.fromZpk ──► SosFilter
 *                                                         (at M·fs)            └─► OversampledFilter = sections at M·fs + Decimator (M = 1, 2, 4)
 * </pre>
 *
 * <h2>Coefficient convention</h2>
 * A {@link org.roseate.digital.Biquad} holds {@code b} = numerator, {@code a} = denominator, in descending
 * powers of z⁻¹ and normalised so that a0 = 1:
 * <pre>
 *          b0 + b1·z⁻¹ + b2·z⁻²
 * H(z) = ------------------------
 *          1  + a1·z⁻¹ + a2·z⁻²
 * </pre>
 * This is the row layout of scipy.signal's "sos" arrays, {@code [b0, b1, b2, 1, a1, a2]}.
 *
 * <h2>State convention</h2>
 * {@link org.roseate.digital.SosFilter} runs each section in transposed direct form II with two state
 * values s1, s2 per section, the same recursion as scipy.signal.sosfilt:
 * <pre>
 * y  = b0·x + s1
 * s1 = b1·x − a1·y + s2
 * s2 = b2·x − a2·y
 * </pre>
 * State is zero after construction and after {@code reset()}.
 *
 * <h2>Design and state</h2>
 * Designs ({@code DigitalZpk}, {@code SosDesign}, {@code HalfbandDecimator}, {@code Decimator},
 * {@code OversampledFilter}) are immutable and may be shared between threads; the running objects
 * ({@code SosFilter}, the {@code Runtime} classes) hold state, are confined to one thread, and allocate
 * nothing in {@code process}.
 */
package org.roseate.digital;
