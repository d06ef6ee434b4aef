package org.roseate.app;

import java.util.ArrayList;
import java.util.List;
import javafx.scene.chart.XYChart;

/** Filling chart series from arrays, in place where the shape is unchanged (no node churn at display rate). */
final class ObservableData {
    private ObservableData() {
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
            return;
        }
        List<XYChart.Data<String, Number>> bars = new ArrayList<>(labels.size());
        for (int i = 0; i < labels.size(); i++) {
            bars.add(new XYChart.Data<>(labels.get(i), finite(values[i])));
        }
        data.setAll(bars);
    }

    private static double finite(double v) {
        return Double.isFinite(v) ? v : 0;
    }

    /** The y values of a line series, in order. */
    static double[] yValues(XYChart.Series<Number, Number> s) {
        return s.getData().stream().mapToDouble(d -> d.getYValue().doubleValue()).toArray();
    }
}
