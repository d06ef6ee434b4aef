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

    BandChart(String title, String yLabel, String seriesName) {
        super(new CategoryAxis(), new NumberAxis());
        setTitle(title);
        getXAxis().setLabel("Band, nominal midband frequency (Hz)");
        getYAxis().setLabel(yLabel);
        ((NumberAxis) getYAxis()).setForceZeroInRange(true);
        setAnimated(false);
        setLegendVisible(false);
        setBarGap(1);
        setCategoryGap(3);
        bars.setName(seriesName);
        setData(FXCollections.observableArrayList(List.of(bars)));
        getStyleClass().add("band-chart");
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
        ObservableData.redraw(this);
    }

    void clear() {
        bars.getData().clear();
        whiskersDb = null;
        markersDb = null;
        ObservableData.redraw(this);
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
