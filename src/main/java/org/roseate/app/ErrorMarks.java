package org.roseate.app;

import javafx.geometry.Point2D;
import javafx.scene.Node;
import javafx.scene.control.TextArea;
import javafx.scene.layout.Pane;
import javafx.scene.layout.StackPane;
import javafx.scene.shape.LineTo;
import javafx.scene.shape.MoveTo;
import javafx.scene.shape.PathElement;
import javafx.scene.shape.Rectangle;
import javafx.scene.text.Text;

/**
 * Marks a span of a {@link TextArea}'s text (the place of a design error) with a tinted box and an
 * underline drawn on a layer above the editor, so that the place shows while the user types: the
 * caret and the selection are left alone. The marks follow scrolling and resizing; a span that no
 * longer fits the text is not drawn.
 */
final class ErrorMarks {
    /** Longest span marked, chars; a longer one is marked over its first this-many characters. */
    static final int MAX_MARKED_CHARS = 400;

    private final TextArea editor;
    private final Pane layer = new Pane();
    private final StackPane node;
    private TextSpan span;
    private Text watched;

    ErrorMarks(TextArea editor) {
        this.editor = editor;
        layer.setMouseTransparent(true);
        layer.setManaged(true);
        Rectangle clip = new Rectangle();
        clip.widthProperty().bind(layer.widthProperty());
        clip.heightProperty().bind(layer.heightProperty());
        layer.setClip(clip);
        node = new StackPane(editor, layer);
        editor.scrollTopProperty().addListener((o, a, b) -> redraw());
        editor.scrollLeftProperty().addListener((o, a, b) -> redraw());
        editor.widthProperty().addListener((o, a, b) -> redraw());
        editor.heightProperty().addListener((o, a, b) -> redraw());
        editor.textProperty().addListener((o, a, b) -> redraw());
    }

    /** The editor with its mark layer, to put in the layout in place of the editor. */
    Node node() {
        return node;
    }

    /** Marks {@code s}, or clears the marks for null. */
    void show(TextSpan s) {
        span = s;
        redraw();
    }

    /** How many mark shapes are drawn now (for tests). */
    int shapes() {
        return layer.getChildren().size();
    }

    private void redraw() {
        layer.getChildren().clear();
        Text text = paragraph();
        if (text != null && text != watched) {
            // scrolling moves the text node, not the editor: follow the node's place on the scene
            watched = text;
            text.localToSceneTransformProperty().addListener((o, a, b) -> redraw());
        }
        if (span == null || text == null || span.end() > text.getText().length()) {
            return;
        }
        int end = Math.max(span.start() + 1, Math.min(span.end(), span.start() + MAX_MARKED_CHARS));
        end = Math.min(end, text.getText().length());
        if (end <= span.start()) {
            return;
        }
        // rangeShape gives one closed rectangle (move-to and four line-tos) per line the range covers
        PathElement[] shape = text.rangeShape(span.start(), end);
        for (int i = 0; i + 4 < shape.length; i += 5) {
            if (!(shape[i] instanceof MoveTo m) || !(shape[i + 2] instanceof LineTo opposite)) {
                continue;
            }
            Point2D a = layer.sceneToLocal(text.localToScene(m.getX(), m.getY()));
            Point2D b = layer.sceneToLocal(text.localToScene(opposite.getX(), opposite.getY()));
            if (a != null && b != null) {
                box(Math.min(a.getX(), b.getX()), Math.min(a.getY(), b.getY()), Math.max(a.getX(), b.getX()),
                        Math.max(a.getY(), b.getY()));
            }
        }
    }

    /** The editor skin's text node (one node holds the whole text), or null before the skin exists. */
    private Text paragraph() {
        for (Node n : editor.lookupAll(".text")) {
            if (n instanceof Text t && t.getText() != null && t.getText().equals(editor.getText())
                    && t.getParent() != null && !(t.getParent() instanceof javafx.scene.control.Labeled)) {
                return t;
            }
        }
        return null;
    }

    private void box(double x0, double top, double x1, double bottom) {
        Rectangle tint = new Rectangle(x0, top, Math.max(1, x1 - x0), Math.max(1, bottom - top));
        tint.getStyleClass().add("error-mark");
        tint.setManaged(false);
        Rectangle underline = new Rectangle(x0, bottom - 2, Math.max(1, x1 - x0), 2);
        underline.getStyleClass().add("error-underline");
        underline.setManaged(false);
        layer.getChildren().addAll(tint, underline);
    }
}
