/**
 * PNG and SVG charts of responses, deviations and bands against a logarithmic frequency axis,
 * drawn with JFreeChart (SVG through JFreeSVG). The charts are described by plain records
 * ({@link org.roseate.plot.FrequencyChart} and its panels), so the tools and the CLI never touch
 * the charting library; {@link org.roseate.plot.ChartFiles} renders and writes them atomically.
 * Rendering is headless: {@code java.awt.headless} is set to true before the first chart.
 * Frequencies are in Hz, levels in dB.
 */
package org.roseate.plot;
