package org.roseate.app;

import java.util.ArrayList;
import java.util.List;
import javafx.beans.property.SimpleStringProperty;
import javafx.geometry.Insets;
import javafx.scene.Node;
import javafx.scene.control.Label;
import javafx.scene.control.TableColumn;
import javafx.scene.control.TableView;
import javafx.scene.layout.Priority;
import javafx.scene.layout.VBox;
import org.roseate.model.CircuitModel;
import org.roseate.model.Root;

/**
 * Poles and zeros of the design in the editor with their natural frequency f0 = |s|/(2π) and
 * Q = |s|/(−2·Re s) for a complex pair, from the same model {@code analyze} reports
 * ({@link CircuitModel#poles()}, {@link CircuitModel#zeros()}). Follows every edit.
 */
final class PolesView {
    /** One root: its kind, f0 in Hz, Q (blank for a real root) and s/(2π) in Hz. */
    record Row(String kind, Root root) {
        String f0() {
            return ToolText.f("%.4f", root.hz());
        }

        String q() {
            return root.isReal() ? (root.s().re() > 0 ? "real, right half-plane" : root.hz() == 0 ? "at the origin" : "real")
                    : ToolText.f("%.4f", root.q());
        }

        String s() {
            return ToolText.f("%.4f %s %.4fj", root.s().re() / (2 * Math.PI), root.s().im() < 0 ? "−" : "+",
                    Math.abs(root.s().im()) / (2 * Math.PI));
        }
    }

    private final VBox root = new VBox(6);
    private final TableView<Row> table = new TableView<>();
    private final Label title = new Label("Poles and zeros");

    PolesView(MainWindow window) {
        title.getStyleClass().add("section-title");
        table.getColumns().setAll(List.of(col("", Row::kind, 60), col("f0 (Hz)", Row::f0, 120), col("Q", Row::q, 160),
                col("s / 2π (Hz)", Row::s, 240)));
        table.setPlaceholder(new Label("The poles and zeros appear here once the design reads without error."));
        Label note = new Label("One row per real root or complex pair. f0 = |s|/2π; Q = |s|/(−2·Re s), the pair's "
                + "quality factor (a real root has none).");
        note.setWrapText(true);
        note.getStyleClass().add("readout");
        VBox.setVgrow(table, Priority.ALWAYS);
        root.getChildren().setAll(title, table, note);
        root.setPadding(new Insets(10));
        window.modelProperty().addListener((o, a, m) -> show(m));
        show(window.model());
    }

    private static TableColumn<Row, String> col(String name, java.util.function.Function<Row, String> f, double width) {
        TableColumn<Row, String> c = new TableColumn<>(name);
        c.setCellValueFactory(x -> new SimpleStringProperty(f.apply(x.getValue())));
        c.setPrefWidth(width);
        c.setSortable(false);
        return c;
    }

    void show(CircuitModel m) {
        if (m == null) {
            table.getItems().clear();
            return;
        }
        List<Row> rows = new ArrayList<>();
        m.poles().forEach(r -> rows.add(new Row("pole", r)));
        m.zeros().forEach(r -> rows.add(new Row("zero", r)));
        table.getItems().setAll(rows);
        title.setText("Poles and zeros: " + m.design().name());
    }

    TableView<Row> table() {
        return table;
    }

    Node root() {
        return root;
    }
}
