package org.roseate.app;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import javafx.beans.property.ReadOnlyStringProperty;
import javafx.beans.property.ReadOnlyStringWrapper;
import javafx.geometry.VPos;
import javafx.scene.canvas.Canvas;
import javafx.scene.canvas.GraphicsContext;
import javafx.scene.input.MouseButton;
import javafx.scene.input.MouseEvent;
import javafx.scene.input.ScrollEvent;
import javafx.scene.layout.Region;
import javafx.scene.paint.Color;
import javafx.scene.text.Font;
import javafx.scene.text.TextAlignment;
import org.roseate.bands.Band;

/**
 * A band chart for live readings, drawn on one canvas: a bar per band from 0 dB with ± whiskers,
 * line traces over the band centres (the ideal pink line, the design, stored reference traces), a
 * log-frequency x axis and a dB y axis.
 *
 * <p>It is drawn straight after every change of data or size, so a live reading can never wait on a
 * layout pass (the JavaFX charts' freeze, see {@link ObservableData#redraw}). Interaction: the band
 * under the pointer is read out (band, value, ±, each line's value); the wheel zooms both axes about
 * the pointer (Shift: frequency only, Ctrl: level only); dragging pans both axes; a double click
 * goes back to the automatic scales.
 *
 * <p>Automatic scales: the frequency axis spans the bands' edges; the level axis spans what is drawn
 * (bars, whiskers, lines), at least {@code minSpanDb} wide, rounded out to its tick step. With
 * nothing to draw it shows the chart's own empty range, so an empty chart never shows a placeholder
 * range or a span of rounding noise.
 */
final class ReadingsChart extends Region {
    /** A line over the band centres; NaN values leave gaps. */
    record Trace(String name, double[] valuesDb, Color color, boolean dashed) {
        Trace {
            valuesDb = valuesDb.clone();
        }
    }

    /** Plot-area insets, px. */
    static final double LEFT = 58;
    static final double RIGHT = 14;
    static final double TOP = 44;
    /** Baselines of the title row and the legend row, px. */
    static final double TITLE_Y = 11;
    static final double LEGEND_Y = 30;
    static final double BOTTOM = 38;
    /** Zoom factor per wheel notch (40 px of scroll). */
    static final double ZOOM_PER_NOTCH = 1.25;
    /** Lowest frequency the x axis may show when bands are absent, Hz, and highest. */
    static final double EMPTY_LO_HZ = 20;
    static final double EMPTY_HI_HZ = 20000;

    private static final Color BAR = Color.web("#5e9ca1");
    private static final Color WHISKER = Color.web("#2a2c30");
    private static final Color GRID = Color.web("#e6e2da");
    private static final Color AXIS = Color.web("#6b6f76");
    private static final Color INK = Color.web("#2a2c30");
    private static final Color HOVER = Color.web("#b0475a22");

    private final Canvas canvas = new Canvas();
    private final String title;
    private final String yLabel;
    private final double emptyLoDb;
    private final double emptyHiDb;
    private final double minSpanDb;
    private final ReadOnlyStringWrapper readout = new ReadOnlyStringWrapper(this, "readout", "");
    private List<Band> bands = List.of();
    private double[] valuesDb;
    private double[] sigmaDb;
    private String barName = "Reading";
    private List<Trace> lines = List.of();
    private List<Trace> references = List.of();
    private List<Trace> notes = List.of();
    private boolean auto = true;
    private double xLo;
    private double xHi;
    private double yLo;
    private double yHi;
    private int hover = -1;
    private double dragX;
    private double dragY;
    private double[] drawnBarTops = new double[0];
    private long draws;

    /**
     * @param emptyLoDb the level axis's lower bound with nothing to show, dB
     * @param emptyHiDb its upper bound, dB (&gt; emptyLoDb)
     * @param minSpanDb the narrowest automatic level span, dB (&gt; 0)
     */
    ReadingsChart(String title, String yLabel, double emptyLoDb, double emptyHiDb, double minSpanDb) {
        if (!(emptyHiDb > emptyLoDb) || !(minSpanDb > 0)) {
            throw new IllegalArgumentException("empty range " + emptyLoDb + " … " + emptyHiDb + ", span " + minSpanDb);
        }
        this.title = title;
        this.yLabel = yLabel;
        this.emptyLoDb = emptyLoDb;
        this.emptyHiDb = emptyHiDb;
        this.minSpanDb = minSpanDb;
        getChildren().add(canvas);
        getStyleClass().add("readings-chart");
        setMinSize(240, 160);
        setPrefSize(640, 320);
        canvas.addEventHandler(MouseEvent.MOUSE_MOVED, e -> hoverAt(e.getX()));
        canvas.addEventHandler(MouseEvent.MOUSE_EXITED, e -> hoverAt(Double.NaN));
        canvas.addEventHandler(MouseEvent.MOUSE_PRESSED, e -> {
            dragX = e.getX();
            dragY = e.getY();
        });
        canvas.addEventHandler(MouseEvent.MOUSE_DRAGGED, e -> {
            pan(e.getX() - dragX, e.getY() - dragY);
            dragX = e.getX();
            dragY = e.getY();
        });
        canvas.addEventHandler(MouseEvent.MOUSE_CLICKED, e -> {
            if (e.getButton() == MouseButton.PRIMARY && e.getClickCount() == 2) {
                resetView();
            }
        });
        canvas.addEventHandler(ScrollEvent.SCROLL, e -> {
            double delta = e.getDeltaY() != 0 ? e.getDeltaY() : e.getDeltaX();
            if (delta == 0) {
                return;
            }
            double factor = Math.pow(ZOOM_PER_NOTCH, -delta / 40);
            zoom(e.getX(), e.getY(), factor, !e.isControlDown(), !e.isShiftDown());
            e.consume();
        });
    }

    // ---- data ----

    /** The bands, in frequency order; clears the reading when they change. */
    void setBands(List<Band> b) {
        if (!b.equals(bands)) {
            bands = List.copyOf(b);
            valuesDb = null;
            sigmaDb = null;
            hover = -1;
        }
        draw();
    }

    /**
     * The bars.
     *
     * @param values one per band, dB (NaN: no bar)
     * @param sigma  ± per band, dB (NaN: no whisker), or null
     */
    void setReading(String name, double[] values, double[] sigma) {
        if (values != null && values.length != bands.size() || sigma != null && values != null && sigma.length != values.length) {
            throw new IllegalArgumentException(bands.size() + " bands, " + (values == null ? 0 : values.length) + " values");
        }
        barName = name;
        valuesDb = values == null ? null : values.clone();
        sigmaDb = sigma == null ? null : sigma.clone();
        refreshReadout();
        draw();
    }

    void clearReading() {
        setReading(barName, null, null);
    }

    /** The lines drawn over the bars (target, design). */
    void setLines(List<Trace> l) {
        lines = List.copyOf(l);
        refreshReadout();
        draw();
    }

    /** Values named in the read-out but not drawn (a level beside a difference), one per band. */
    void setNotes(List<Trace> n) {
        notes = List.copyOf(n);
        refreshReadout();
        draw();
    }

    /** The stored reference traces overlaid. */
    void setReferences(List<Trace> r) {
        references = List.copyOf(r);
        draw();
    }

    // ---- scales ----

    /** Back to the automatic scales (the double click). */
    void resetView() {
        auto = true;
        draw();
    }

    boolean autoScaled() {
        return auto;
    }

    /** The frequency axis's bounds, Hz, as last drawn. */
    double[] xBoundsHz() {
        updateAuto();
        return new double[] {Math.pow(10, xLo), Math.pow(10, xHi)};
    }

    /** The level axis's bounds, dB, as last drawn. */
    double[] yBoundsDb() {
        updateAuto();
        return new double[] {yLo, yHi};
    }

    /**
     * Zooms about a point of the canvas.
     *
     * @param factor &gt; 1 widens the view (zoom out), &lt; 1 narrows it
     */
    void zoom(double px, double py, double factor, boolean alongX, boolean alongY) {
        updateAuto();
        auto = false;
        if (alongX) {
            double at = xAt(px);
            xLo = at - (at - xLo) * factor;
            xHi = at + (xHi - at) * factor;
        }
        if (alongY) {
            double at = yAt(py);
            yLo = at - (at - yLo) * factor;
            yHi = at + (yHi - at) * factor;
        }
        draw();
    }

    /** Moves the view by a drag of (dx, dy) px: the content follows the pointer. */
    void pan(double dx, double dy) {
        updateAuto();
        auto = false;
        double sx = (xHi - xLo) / plotWidth();
        double sy = (yHi - yLo) / plotHeight();
        xLo -= dx * sx;
        xHi -= dx * sx;
        yLo += dy * sy;
        yHi += dy * sy;
        draw();
    }

    private void updateAuto() {
        if (!auto) {
            return;
        }
        if (bands.isEmpty()) {
            xLo = Math.log10(EMPTY_LO_HZ);
            xHi = Math.log10(EMPTY_HI_HZ);
        } else {
            xLo = Math.log10(bands.get(0).lowHz());
            xHi = Math.log10(bands.get(bands.size() - 1).highHz());
        }
        double lo = Double.POSITIVE_INFINITY;
        double hi = Double.NEGATIVE_INFINITY;
        if (valuesDb != null) {
            for (int i = 0; i < valuesDb.length; i++) {
                double v = valuesDb[i];
                if (!Double.isFinite(v)) {
                    continue;
                }
                double s = sigmaDb != null && Double.isFinite(sigmaDb[i]) ? sigmaDb[i] : 0;
                lo = Math.min(lo, Math.min(0, v - s));
                hi = Math.max(hi, Math.max(0, v + s));
            }
        }
        for (List<Trace> group : List.of(lines, references)) {
            for (Trace t : group) {
                for (double v : t.valuesDb()) {
                    if (Double.isFinite(v)) {
                        lo = Math.min(lo, v);
                        hi = Math.max(hi, v);
                    }
                }
            }
        }
        if (lo > hi) {
            yLo = emptyLoDb;
            yHi = emptyHiDb;
            return;
        }
        double[] r = levelRange(lo, hi, minSpanDb);
        yLo = r[0];
        yHi = r[1];
    }

    /**
     * An automatic level axis for data from {@code lo} to {@code hi} dB: 6 % of the span to spare on
     * each side, at least {@code minSpanDb} wide, rounded out to a 1-2-5 step of about a sixth of it.
     *
     * @return {lower, upper, step}, dB
     */
    static double[] levelRange(double lo, double hi, double minSpanDb) {
        return levelRange(lo, hi, minSpanDb, 6);
    }

    /**
     * As {@link #levelRange(double, double, double)} with a step of about 1/{@code divisions} of the
     * span (JavaFX's number axis labels every step from the lower bound, so small charts want fewer).
     */
    static double[] levelRange(double lo, double hi, double minSpanDb, int divisions) {
        double span = hi - lo;
        double pad = Math.max(0.06 * span, (minSpanDb - span) / 2);
        double step = niceStep((span + 2 * pad) / divisions);
        // 1e-9 of a step: values that sit on a step but for rounding do not add a step
        return new double[] {Math.floor((lo - pad) / step + 1e-9) * step, Math.ceil((hi + pad) / step - 1e-9) * step, step};
    }

    /** The 1-2-5 step nearest above {@code raw} (&gt; 0). */
    static double niceStep(double raw) {
        double decade = Math.pow(10, Math.floor(Math.log10(raw)));
        for (double m : new double[] {1, 2, 5, 10}) {
            if (m * decade >= raw * 0.999) {
                return m * decade;
            }
        }
        return 10 * decade;
    }

    // ---- geometry ----

    private double plotWidth() {
        return Math.max(1, canvas.getWidth() - LEFT - RIGHT);
    }

    private double plotHeight() {
        return Math.max(1, canvas.getHeight() - TOP - BOTTOM);
    }

    private double px(double log10Hz) {
        return LEFT + (log10Hz - xLo) / (xHi - xLo) * plotWidth();
    }

    private double py(double db) {
        return TOP + (yHi - db) / (yHi - yLo) * plotHeight();
    }

    private double xAt(double px) {
        return xLo + (px - LEFT) / plotWidth() * (xHi - xLo);
    }

    private double yAt(double py) {
        return yHi - (py - TOP) / plotHeight() * (yHi - yLo);
    }

    /** The canvas x of a band's centre (for tests driving the pointer), px. */
    double bandCentreX(int i) {
        updateAuto();
        return px(Math.log10(bands.get(i).midHz()));
    }

    @Override
    protected void layoutChildren() {
        double w = snapSizeX(getWidth());
        double h = snapSizeY(getHeight());
        if (canvas.getWidth() != w || canvas.getHeight() != h) {
            canvas.setWidth(w);
            canvas.setHeight(h);
            draw();
        }
    }

    @Override
    protected double computePrefWidth(double height) {
        return 640;
    }

    @Override
    protected double computePrefHeight(double width) {
        return 320;
    }

    // ---- read-out ----

    private void hoverAt(double x) {
        int at = -1;
        if (Double.isFinite(x) && x >= LEFT && x <= LEFT + plotWidth()) {
            double f = Math.pow(10, xAt(x));
            for (int i = 0; i < bands.size(); i++) {
                if (f >= bands.get(i).lowHz() && f < bands.get(i).highHz()) {
                    at = i;
                }
            }
        }
        if (at != hover) {
            hover = at;
            refreshReadout();
            draw();
        }
    }

    /** Shows the read-out of band i as if the pointer were over it (−1: none). */
    void hoverBand(int i) {
        hover = i;
        refreshReadout();
        draw();
    }

    /** "band: value ± σ dB · line value …" for the band under the pointer, or "". */
    ReadOnlyStringProperty readoutProperty() {
        return readout.getReadOnlyProperty();
    }

    private void refreshReadout() {
        if (hover < 0 || hover >= bands.size()) {
            readout.set("");
            return;
        }
        Band b = bands.get(hover);
        StringBuilder sb = new StringBuilder(b.label()).append(" Hz band");
        if (valuesDb != null && Double.isFinite(valuesDb[hover])) {
            sb.append(": ").append(barName).append(' ').append(db(valuesDb[hover]));
            if (sigmaDb != null && Double.isFinite(sigmaDb[hover])) {
                sb.append(String.format(Locale.ROOT, " ± %.2f", sigmaDb[hover]));
            }
            sb.append(" dB");
        } else {
            sb.append(": no reading");
        }
        for (Trace t : concat(lines, notes)) {
            double v = hover < t.valuesDb().length ? t.valuesDb()[hover] : Double.NaN;
            sb.append(" · ").append(t.name()).append(' ').append(Double.isFinite(v) ? db(v) + " dB" : "—");
        }
        readout.set(sb.toString());
    }

    private static List<Trace> concat(List<Trace> a, List<Trace> b) {
        List<Trace> all = new ArrayList<>(a);
        all.addAll(b);
        return all;
    }

    private static String db(double v) {
        return String.format(Locale.ROOT, "%+.2f", v);
    }

    // ---- drawing ----

    /** The bars' values, dB, one per band (empty without a reading). */
    double[] values() {
        return valuesDb == null ? new double[0] : valuesDb.clone();
    }

    /** The whiskers' ±, dB, one per band (empty without). */
    double[] sigmas() {
        return sigmaDb == null ? new double[0] : sigmaDb.clone();
    }

    /** How many reference traces are overlaid. */
    int referenceCount() {
        return references.size();
    }

    /** The drawing surface, which receives the pointer's events (for tests). */
    Canvas canvas() {
        return canvas;
    }

    /** Times the canvas was drawn (for tests). */
    long draws() {
        return draws;
    }

    /** The canvas y of each bar's top as last drawn (NaN: no bar), px (for tests). */
    double[] drawnBarTops() {
        return drawnBarTops.clone();
    }

    private void draw() {
        updateAuto();
        draws++;
        GraphicsContext g = canvas.getGraphicsContext2D();
        double w = canvas.getWidth();
        double h = canvas.getHeight();
        g.setFill(Color.WHITE);
        g.fillRect(0, 0, w, h);
        if (w < LEFT + RIGHT + 10 || h < TOP + BOTTOM + 10) {
            return;
        }
        g.setFont(Font.font(11));
        g.setFill(INK);
        g.setTextAlign(TextAlignment.LEFT);
        g.setTextBaseline(VPos.CENTER);
        g.setFont(Font.font(null, javafx.scene.text.FontWeight.BOLD, 12));
        g.fillText(title, LEFT, TITLE_Y);
        g.setFont(Font.font(11));
        drawGridAndAxes(g);

        g.save();
        g.beginPath();
        g.rect(LEFT, TOP, plotWidth(), plotHeight());
        g.clip();
        if (hover >= 0 && hover < bands.size()) {
            Band b = bands.get(hover);
            g.setFill(HOVER);
            double x0 = px(Math.log10(b.lowHz()));
            g.fillRect(x0, TOP, px(Math.log10(b.highHz())) - x0, plotHeight());
        }
        drawBars(g);
        for (Trace t : references) {
            drawTrace(g, t);
        }
        for (Trace t : lines) {
            drawTrace(g, t);
        }
        g.restore();
        drawLegend(g);
    }

    private void drawGridAndAxes(GraphicsContext g) {
        double step = niceStep((yHi - yLo) / 6);
        int decimals = Math.max(0, (int) Math.ceil(-Math.log10(step) - 1e-9));
        g.setLineWidth(1);
        g.setTextAlign(TextAlignment.RIGHT);
        for (double v = Math.ceil(yLo / step) * step; v <= yHi + step * 1e-6; v += step) {
            double y = Math.round(py(v)) + 0.5;
            g.setStroke(Math.abs(v) < step * 1e-6 ? AXIS : GRID);
            g.strokeLine(LEFT, y, LEFT + plotWidth(), y);
            g.setFill(AXIS);
            g.fillText(String.format(Locale.ROOT, "%." + decimals + "f", Math.abs(v) < step * 1e-6 ? 0.0 : v), LEFT - 6, y);
        }
        g.setTextAlign(TextAlignment.CENTER);
        g.setTextBaseline(VPos.TOP);
        double lastLabelEnd = Double.NEGATIVE_INFINITY;
        for (int decade = (int) Math.floor(xLo) - 1; decade <= (int) Math.ceil(xHi); decade++) {
            for (double m : new double[] {1, 2, 5}) {
                double lx = decade + Math.log10(m);
                if (lx < xLo - 1e-9 || lx > xHi + 1e-9) {
                    continue;
                }
                double x = Math.round(px(lx)) + 0.5;
                g.setStroke(GRID);
                g.strokeLine(x, TOP, x, TOP + plotHeight());
                String label = hzLabel(Math.pow(10, lx));
                double half = textWidth(label) / 2;
                if (x - half > lastLabelEnd + 4) { // a label that would touch the previous one is left out
                    g.setFill(AXIS);
                    g.fillText(label, x, TOP + plotHeight() + 4);
                    lastLabelEnd = x + half;
                }
            }
        }
        g.setStroke(AXIS);
        g.strokeRect(LEFT + 0.5, TOP + 0.5, plotWidth() - 1, plotHeight() - 1);
        g.setFill(AXIS);
        g.fillText("Frequency (Hz)", LEFT + plotWidth() / 2, TOP + plotHeight() + 20);
        g.save();
        g.translate(12, TOP + plotHeight() / 2);
        g.rotate(-90);
        g.setTextBaseline(VPos.CENTER);
        g.fillText(yLabel, 0, 0);
        g.restore();
        g.setTextBaseline(VPos.CENTER);
    }

    /** 20, 50, 100, 200, 500, 1k, 2k, 5k, 10k, 20k. */
    static String hzLabel(double hz) {
        double r = Math.round(hz * 1000) / 1000.0;
        if (r >= 1000) {
            double k = r / 1000;
            return (k == Math.rint(k) ? String.valueOf((long) k) : String.valueOf(k)) + "k";
        }
        return r == Math.rint(r) ? String.valueOf((long) r) : String.valueOf(r);
    }

    private void drawBars(GraphicsContext g) {
        double[] tops = new double[bands.size()];
        java.util.Arrays.fill(tops, Double.NaN);
        if (valuesDb != null) {
            double zero = py(0);
            for (int i = 0; i < bands.size(); i++) {
                double v = valuesDb[i];
                if (!Double.isFinite(v)) {
                    continue;
                }
                Band b = bands.get(i);
                double x0 = px(Math.log10(b.lowHz()));
                double x1 = px(Math.log10(b.highHz()));
                double inset = (x1 - x0) * 0.14;
                double top = py(v);
                tops[i] = top;
                g.setFill(BAR);
                g.fillRect(x0 + inset, Math.min(top, zero), Math.max(1, x1 - x0 - 2 * inset), Math.abs(zero - top));
                if (sigmaDb != null && Double.isFinite(sigmaDb[i]) && sigmaDb[i] > 0) {
                    double cx = (x0 + x1) / 2;
                    double hi = py(v + sigmaDb[i]);
                    double lo = py(v - sigmaDb[i]);
                    double cap = Math.max(2, (x1 - x0) * 0.18);
                    g.setStroke(WHISKER);
                    g.setLineWidth(1.2);
                    g.strokeLine(cx, hi, cx, lo);
                    g.strokeLine(cx - cap, hi, cx + cap, hi);
                    g.strokeLine(cx - cap, lo, cx + cap, lo);
                }
            }
        }
        drawnBarTops = tops;
    }

    private void drawTrace(GraphicsContext g, Trace t) {
        g.setStroke(t.color());
        g.setLineWidth(t.dashed() ? 1.5 : 2);
        g.setLineDashes(t.dashed() ? new double[] {6, 4} : null);
        g.beginPath();
        boolean open = false;
        for (int i = 0; i < bands.size() && i < t.valuesDb().length; i++) {
            double v = t.valuesDb()[i];
            if (!Double.isFinite(v)) {
                open = false;
                continue;
            }
            double x = px(Math.log10(bands.get(i).midHz()));
            double y = py(v);
            if (open) {
                g.lineTo(x, y);
            } else {
                g.moveTo(x, y);
                open = true;
            }
        }
        g.stroke();
        g.setLineDashes(null);
    }

    private void drawLegend(GraphicsContext g) {
        List<Object[]> items = new ArrayList<>();
        if (valuesDb != null) {
            items.add(new Object[] {barName + " (± 1σ)", BAR, false});
        }
        for (Trace t : lines) {
            items.add(new Object[] {t.name(), t.color(), t.dashed()});
        }
        for (Trace t : references) {
            items.add(new Object[] {t.name(), t.color(), t.dashed()});
        }
        // entries are 16 px of line, 6 px, the name, 12 px; the last ones are dropped when they do not fit
        double room = plotWidth() - 8;
        double total = 0;
        int fit = 0;
        for (Object[] item : items) {
            double wi = 34 + textWidth((String) item[0]);
            if (total + wi > room) {
                break;
            }
            total += wi;
            fit++;
        }
        double x = LEFT + plotWidth() - 8 - total;
        g.setTextAlign(TextAlignment.LEFT);
        g.setTextBaseline(VPos.CENTER);
        for (int i = 0; i < fit; i++) {
            String name = (String) items.get(i)[0];
            g.setStroke((Color) items.get(i)[1]);
            g.setLineWidth(3);
            g.setLineDashes((Boolean) items.get(i)[2] ? new double[] {4, 3} : null);
            g.strokeLine(x, LEGEND_Y, x + 16, LEGEND_Y);
            g.setLineDashes(null);
            g.setFill(INK);
            g.fillText(name, x + 22, LEGEND_Y);
            x += 34 + textWidth(name);
        }
        String r = readout.get();
        if (!r.isEmpty()) {
            g.setFont(Font.font(11));
            double tw = textWidth(r) + 12;
            double bx = LEFT + 6;
            double by = TOP + 6;
            g.setFill(Color.web("#fffffff0"));
            g.fillRect(bx, by, tw, 20);
            g.setStroke(GRID);
            g.setLineWidth(1);
            g.strokeRect(bx + 0.5, by + 0.5, tw, 20);
            g.setFill(INK);
            g.setTextAlign(TextAlignment.LEFT);
            g.fillText(r, bx + 6, by + 10);
        }
    }

    private static double textWidth(String s) {
        javafx.scene.text.Text t = new javafx.scene.text.Text(s);
        t.setFont(Font.font(11));
        return t.getLayoutBounds().getWidth();
    }
}
