package org.roseate.app;

import java.util.ArrayList;
import java.util.List;
import javafx.collections.FXCollections;
import javafx.scene.Node;
import javafx.scene.chart.BarChart;
import javafx.scene.chart.CategoryAxis;
import javafx.scene.chart.NumberAxis;
import javafx.scene.chart.XYChart;
import javafx.scene.shape.Line;

/**
 * Fractional-octave band bars (one category per band, labelled with its nominal frequency), with
 * optional ± whiskers on the bars (one standard deviation of the measured level) and optional
 * short markers per band (the design's prediction). The bars are the first series.
 */
final class BandChart extends BarChart<String, Number> {
    private final XYChart.Series<String, Number> bars = new XYChart.Series<>();
    private final List<Node> overlay = new ArrayList<>();
    private double[] whiskersDb;
    private double[] markersDb;
    /** Narrowest automatic level span, dB. */
    static final double MIN_SPAN_DB = 1;
    private boolean ownScale = true;

    BandChart(String title, String yLabel, String seriesName) {
        super(new CategoryAxis(), new NumberAxis());
        setTitle(title);
        getXAxis().setLabel("Band, nominal midband frequency (Hz)");
        getYAxis().setLabel(yLabel);
        ((NumberAxis) getYAxis()).setForceZeroInRange(true);
        ((NumberAxis) getYAxis()).setMinorTickCount(0);
        setAnimated(false);
        setLegendVisible(false);
        setBarGap(1);
        setCategoryGap(3);
        bars.setName(seriesName);
        setData(FXCollections.observableArrayList(List.of(bars)));
        getStyleClass().add("band-chart");
        scale();
    }

    /** The view sets the level axis itself from now on (the automatic scale of {@link #scale} stops). */
    void fixedScale() {
        ownScale = false;
        getYAxis().setAutoRanging(false);
    }

    XYChart.Series<String, Number> bars() {
        return bars;
    }

    /**
     * Shows one bar per band; updates the bars in place when the labels are the same as before.
     *
     * @param whiskers ± per band, dB, or null for none
     * @param markers  a marker value per band, dB, or null for none
     */
    void show(List<String> labels, double[] values, double[] whiskers, double[] markers) {
        ObservableData.setBars(bars, labels, values);
        this.whiskersDb = whiskers == null ? null : whiskers.clone();
        this.markersDb = markers == null ? null : markers.clone();
        scale();
        ObservableData.redraw(this);
    }

    void clear() {
        bars.getData().clear();
        whiskersDb = null;
        markersDb = null;
        scale();
        ObservableData.redraw(this);
    }

    /**
     * Unless the view fixed the level axis ({@link #fixedScale}), the axis spans the bars, whiskers and marks by {@link ReadingsChart#levelRange} with at least
     * {@link #MIN_SPAN_DB}; an empty chart shows ±{@link #MIN_SPAN_DB}/2. JavaFX's own auto-ranging
     * would show 0–100 for no data and a ±1e-14 dB axis for values equal within rounding.
     */
    private void scale() {
        NumberAxis y = (NumberAxis) getYAxis();
        if (!ownScale) {
            return;
        }
        y.setAutoRanging(false);
        double lo = 0;
        double hi = 0;
        var data = bars.getData();
        boolean any = false;
        for (int i = 0; i < data.size(); i++) {
            double v = data.get(i).getYValue().doubleValue();
            double w = whiskersDb != null && i < whiskersDb.length && Double.isFinite(whiskersDb[i]) ? whiskersDb[i] : 0;
            double m = markersDb != null && i < markersDb.length && Double.isFinite(markersDb[i]) ? markersDb[i] : v;
            lo = Math.min(lo, Math.min(v - w, m));
            hi = Math.max(hi, Math.max(v + w, m));
            any = true;
        }
        double[] r = ReadingsChart.levelRange(any ? lo : -MIN_SPAN_DB / 2, any ? hi : MIN_SPAN_DB / 2, MIN_SPAN_DB,
                LevelScale.DIVISIONS);
        LevelScale.set(y, r);
    }

    /** The values shown, in band order (for readouts and tests). */
    double[] values() {
        return bars.getData().stream().mapToDouble(d -> d.getYValue().doubleValue()).toArray();
    }

    double[] whiskers() {
        return whiskersDb == null ? null : whiskersDb.clone();
    }

    double[] markers() {
        return markersDb == null ? null : markersDb.clone();
    }

    @Override
    protected void layoutPlotChildren() {
        super.layoutPlotChildren();
        getPlotChildren().removeAll(overlay);
        overlay.clear();
        CategoryAxis x = (CategoryAxis) getXAxis();
        NumberAxis y = (NumberAxis) getYAxis();
        double half = Math.max(2, x.getCategorySpacing() * 0.3);
        for (int i = 0; i < bars.getData().size(); i++) {
            XYChart.Data<String, Number> d = bars.getData().get(i);
            double cx = x.getDisplayPosition(d.getXValue());
            if (Double.isNaN(cx)) {
                continue;
            }
            double v = d.getYValue().doubleValue();
            if (whiskersDb != null && i < whiskersDb.length && Double.isFinite(whiskersDb[i])) {
                // ends kept inside the axis, so a wide ± never makes a line far outside the plot
                double top = y.getDisplayPosition(clamp(v + whiskersDb[i], y));
                double bottom = y.getDisplayPosition(clamp(v - whiskersDb[i], y));
                add(new Line(cx, top, cx, bottom), "whisker");
                add(new Line(cx - half / 2, top, cx + half / 2, top), "whisker");
                add(new Line(cx - half / 2, bottom, cx + half / 2, bottom), "whisker");
            }
            if (markersDb != null && i < markersDb.length && Double.isFinite(markersDb[i])) {
                double my = y.getDisplayPosition(markersDb[i]);
                add(new Line(cx - half, my, cx + half, my), "design-marker");
            }
        }
    }

    private static double clamp(double db, NumberAxis y) {
        return Math.max(y.getLowerBound(), Math.min(y.getUpperBound(), db));
    }

    private void add(Line l, String styleClass) {
        l.getStyleClass().add(styleClass);
        l.setManaged(false);
        overlay.add(l);
        getPlotChildren().add(l);
    }
}
