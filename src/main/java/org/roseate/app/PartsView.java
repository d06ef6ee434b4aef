package org.roseate.app;

import java.util.List;
import java.util.Locale;
import java.util.stream.Collectors;
import javafx.beans.property.SimpleStringProperty;
import javafx.geometry.Insets;
import javafx.scene.Node;
import javafx.scene.control.Label;
import javafx.scene.control.TableColumn;
import javafx.scene.control.TableView;
import javafx.scene.layout.Priority;
import javafx.scene.layout.VBox;
import org.roseate.circuit.Design;
import org.roseate.model.CircuitModel;
import org.roseate.tools.PartsList;
import org.roseate.value.EngineeringValue;

/**
 * The parts list of the design in the editor, as {@code parts} prints it ({@link PartsList}): equal
 * parts grouped with their quantity, value, the E-series that hold it, tolerance and what to buy,
 * then the op-amps. Follows every edit that reads without error.
 */
final class PartsView {
    /** One row of the table: a group of equal parts or an op-amp. */
    record Row(String quantity, String parts, String kind, String value, String si, String series, String tolerance,
            String advice) {
    }

    private final VBox root = new VBox(6);
    private final TableView<Row> table = new TableView<>();
    private final Label title = new Label("Parts list");

    PartsView(MainWindow window) {
        title.getStyleClass().add("section-title");
        table.getColumns().setAll(List.of(col("Qty", Row::quantity, 40), col("Parts", Row::parts, 140),
                col("Kind", Row::kind, 80), col("Value", Row::value, 70), col("SI", Row::si, 90),
                col("In series (IEC 60063)", Row::series, 200), col("Tolerance", Row::tolerance, 80),
                col("What to buy", Row::advice, 420)));
        table.setPlaceholder(new Label("The parts appear here once the design reads without error."));
        VBox.setVgrow(table, Priority.ALWAYS);
        root.getChildren().setAll(title, table);
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
        table.getItems().setAll(rows(m.design()));
        title.setText("Parts list: " + m.design().name());
    }

    /** The rows {@code parts} would print for {@code d}. */
    static List<Row> rows(Design d) {
        List<Row> rows = new java.util.ArrayList<>();
        for (PartsList.Group g : PartsList.grouped(d)) {
            PartsList.Part p = g.first();
            String in = p.series().isEmpty()
                    ? "none; nearest E24 " + EngineeringValue.format(p.nearestE24(), p.kind()) + ", E96 "
                            + EngineeringValue.format(p.nearestE96(), p.kind())
                    : p.series().stream().map(Enum::name).collect(Collectors.joining(" "));
            rows.add(new Row(String.valueOf(g.quantity()), String.join(" ", g.designators()),
                    p.kind().name().toLowerCase(Locale.ROOT), p.letterCode(), p.si(), in,
                    p.tolerance().map(Object::toString).orElse("none given"), p.advice()));
        }
        for (PartsList.OpAmpEntry o : PartsList.opAmps(d)) {
            rows.add(new Row("1", o.name(), "op-amp", "", "", ToolText.f("stage %d: gbwHz %s, openLoopGain %s", o.stage(),
                    Double.toString(o.gbwHz()), Double.toString(o.openLoopGain())), "",
                    "gain-bandwidth product at least gbwHz, noise to suit the level (common practice)"));
        }
        return rows;
    }

    TableView<Row> table() {
        return table;
    }

    Node root() {
        return root;
    }
}
