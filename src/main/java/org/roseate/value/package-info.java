/**
 * Component values: reading and writing them (IEC 60062 letter-and-digit code and SI
 * prefixes), the preferred-number series (IEC 60063:2015, E3 … E192) and tolerances.
 *
 * <h2>Conventions</h2>
 * <ul>
 *   <li>Every value is a {@code double} in the SI base unit of its {@link
 *       org.roseate.value.ComponentKind}: ohms, farads, henries. No method takes or returns
 *       kΩ, nF or µH; prefixes exist only in text.</li>
 *   <li>Values are finite and strictly positive; methods that take one throw
 *       {@link java.lang.IllegalArgumentException} quoting it otherwise, and text that cannot
 *       be read raises {@link org.roseate.value.ValueFormatException}, which carries the
 *       0-based offset of the offending character.</li>
 *   <li>Two values are "the same standard value" when they agree to 1e-9 relative
 *       ({@link org.roseate.value.ESeries#RELATIVE_SLACK}); text is converted to double with
 *       correct rounding, so exact decimals round-trip exactly.</li>
 *   <li>Tolerances are fractions (0.01 for 1 %) in code and percentages in text.</li>
 * </ul>
 * This package depends on nothing else in Roseate.
 */
package org.roseate.value;
