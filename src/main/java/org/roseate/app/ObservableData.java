package org.roseate.app;

import java.util.ArrayList;
import java.util.List;
import javafx.scene.chart.Chart;
import javafx.scene.chart.XYChart;

/**
 * Filling chart series from arrays, in place where the shape is unchanged (no node churn at display
 * rate), and asking the chart itself to be laid out again afterwards (see {@link #redraw}).
 */
final class ObservableData {
    private ObservableData() {
    }

    /**
     * Makes sure the next pulse lays out {@code chart} after its data changed.
     *
     * <p>A chart's own reaction to a data change only asks its inner content pane for a layout. That
     * pane is unmanaged, a layout root, so the request climbs only through ancestors that are clean
     * and stops at the first one that is not. When an earlier layout pass left the chart itself
     * marked dirty under a clean parent (a child of the chart, such as its title, asked for layout
     * while the chart's parent was in the middle of its own pass: the parent ignores requests then,
     * and the chart's mark outlives the pass), the scene never hears of any later change and the
     * drawing freezes until something else (a resize) lays the whole window out. Asking the chart
     * node, whose request goes to its parent and up to the scene, mends that state on every update.
     */
    static void redraw(Chart chart) {
        if (chart != null) {
            LevelScale.apply(chart);
            chart.requestLayout();
        }
    }

    /** Sets the series to (x[i], y[i]); points whose y is not finite are left out. */
    static void setLine(XYChart.Series<Number, Number> s, double[] x, double[] y) {
        List<XYChart.Data<Number, Number>> pts = new ArrayList<>(x.length);
        for (int i = 0; i < x.length; i++) {
            if (Double.isFinite(y[i]) && Double.isFinite(x[i])) {
                pts.add(new XYChart.Data<>(x[i], y[i]));
            }
        }
        var data = s.getData();
        if (data.size() == pts.size()) {
            for (int i = 0; i < pts.size(); i++) {
                XYChart.Data<Number, Number> d = data.get(i);
                d.setXValue(pts.get(i).getXValue());
                d.setYValue(pts.get(i).getYValue());
            }
        } else {
            data.setAll(pts);
        }
        redraw(s.getChart());
    }

    /** Sets one bar per label; a non-finite value shows as 0. */
    static void setBars(XYChart.Series<String, Number> s, List<String> labels, double[] values) {
        var data = s.getData();
        boolean same = data.size() == labels.size();
        for (int i = 0; same && i < labels.size(); i++) {
            same = data.get(i).getXValue().equals(labels.get(i));
        }
        if (same) {
            for (int i = 0; i < labels.size(); i++) {
                data.get(i).setYValue(finite(values[i]));
            }
            redraw(s.getChart());
            return;
        }
        List<XYChart.Data<String, Number>> bars = new ArrayList<>(labels.size());
        for (int i = 0; i < labels.size(); i++) {
            bars.add(new XYChart.Data<>(labels.get(i), finite(values[i])));
        }
        data.setAll(bars);
        redraw(s.getChart());
    }

    private static double finite(double v) {
        return Double.isFinite(v) ? v : 0;
    }

    /** The y values of a line series, in order. */
    static double[] yValues(XYChart.Series<Number, Number> s) {
        return s.getData().stream().mapToDouble(d -> d.getYValue().doubleValue()).toArray();
    }
}
