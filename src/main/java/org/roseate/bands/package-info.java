/**
 * Base-ten fractional-octave bands of IEC 61260-1:2014 (octave and one-third octave):
 * exact midband and edge frequencies, preferred nominal frequencies and their labels, and
 * tables of contiguous bands over a frequency range.
 *
 * <h2>Conventions</h2>
 * <ul>
 *   <li>All frequencies are in hertz ({@code midHz}, {@code lowHz}); never rad/s.</li>
 *   <li>Band index x counts bands from the 1 kHz band (x = 0), negative below it.</li>
 *   <li>The exact midband {@code midHz} is what computations use; {@code nominalHz} and
 *       {@link org.roseate.bands.Band#label()} (ISO 266 preferred numbers: 31.5, 1k, 12.5k)
 *       are names only.</li>
 *   <li>Edges are shared bit for bit between neighbouring bands, so a table tiles its range
 *       without gaps or overlaps.</li>
 *   <li>Bands are supported from the 0.4 Hz to the 100 kHz third-octave band, so that
 *       sub-audio control-voltage work has bands too.</li>
 * </ul>
 * This package depends on nothing else in Roseate.
 */
package org.roseate.bands;
