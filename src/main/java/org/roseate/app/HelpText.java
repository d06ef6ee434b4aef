package org.roseate.app;

/** The texts of the Help menu. */
final class HelpText {
    private HelpText() {
    }

    static final String SHORTCUTS = String.join("\n",
            "Ctrl+O            open a design file",
            "Ctrl+S            save the design",
            "Ctrl+Shift+S      save the design as a new file",
            "Ctrl+E            export the chart last pointed at (PNG or SVG)",
            "Ctrl+Z            undo (Design view)",
            "Ctrl+Shift+Z      redo (also Ctrl+Y)",
            "Ctrl+1 … Ctrl+6   Design, Listen, Measure, Compare, Tools, Bench",
            "Space             play and stop (Listen view, outside text fields)",
            "+ and −           step the selected part one value up or down the series (component table)",
            "F1                this list",
            "Right click on a chart: export it as PNG or SVG.",
            "Tab moves the keyboard focus; the focused control has a blue ring (errors are marked in rose).");

    static final String SAFETY = String.join("\n",
            ListenView.CAUTION,
            "",
            "Before any playback, turn the amplifier down, start at a low level (the default is −30 dBFS RMS) and "
                    + "raise it slowly. Levels above −10 dBFS need \"Allow loud\" on purpose.",
            "Noise carries much more power at high frequencies than music does: white noise especially can burn "
                    + "tweeters at levels that sound moderate. Prefer pink, keep sessions short, take breaks.",
            "Headphones: start far lower still; hearing damage adds up over time and is permanent.",
            "Mains-powered equipment: measure a built circuit through a proper audio interface, never connect "
                    + "anything to mains wiring, and keep line-level signals within the interface's input range.");

    static final String READINGS = String.join("\n",
            "Response |H| (dB): the design's magnitude at each frequency; the target line is the slope it should follow "
                    + "(pink: −3.01 dB/octave).",
            "Deviation (dB): response minus the best-fitting target line; the peak deviation is its largest absolute "
                    + "value over the range.",
            "Band deviation: each octave or third-octave band's level (IEC 61260-1 bands) minus the target's, centred so "
                    + "the largest positive and negative deviations are equal (±).",
            "Measured bands ± (Measure view): Welch-averaged band levels; the whisker is one standard deviation of the "
                    + "reading, which shrinks as averages add up.",
            "Budget: RMS volts at each stage output over the range; headroom = 20·log10(swing/RMS); P(clip) = the "
                    + "chance a Gaussian voltage of that RMS passes the swing. Contributors: each noise source's RMS at "
                    + "the output, largest first (powers add).",
            "Fit: continuous values that follow the target best, then the nearest standard values (E-series) that keep "
                    + "the fit; 'change' is the step from continuous to standard.",
            "Tolerance: percentiles of each band's deviation over random builds within tolerance; yield is the share "
                    + "of builds whose peak band deviation stays within the limit (± its binomial standard error); "
                    + "sensitivity ranks parts by how much their tolerance moves the shape.",
            "Poles and zeros: f0 = |s|/2π; Q of a complex pair = |s|/(−2·Re s).",
            "Diagnose: each part's most probable value given the capture and the tolerances, with an interval; "
                    + "'out of tolerance' when the probability of lying outside reaches the confidence; an ambiguity "
                    + "group is a set of parts the capture cannot tell apart; the residual is what no part values can "
                    + "explain (a large one points to a wiring or topology fault).",
            "ABX: X is A or B at random; the p-value is the chance of scoring at least as well by guessing "
                    + "(one-sided binomial). Below 0.05 the difference was heard.");
}
