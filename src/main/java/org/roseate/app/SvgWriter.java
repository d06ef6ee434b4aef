package org.roseate.app;

import java.util.Locale;

/**
 * A small writer of SVG 1.1 text: elements with attributes, text with XML escaping, numbers with a
 * '.' decimal point and two decimals (0.01 px is far below what any screen or printer shows).
 */
final class SvgWriter {
    private final StringBuilder sb = new StringBuilder();
    private int depth;

    SvgWriter(double width, double height) {
        sb.append("<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n");
        sb.append("<svg xmlns=\"http://www.w3.org/2000/svg\" version=\"1.1\" width=\"").append(n(width))
                .append("\" height=\"").append(n(height)).append("\" viewBox=\"0 0 ").append(n(width)).append(' ')
                .append(n(height)).append("\">\n");
        depth = 1;
    }

    /** A number as SVG wants it: '.' decimal point, at most two decimals, no exponent. */
    static String n(double v) {
        if (!Double.isFinite(v)) {
            throw new IllegalArgumentException("not a finite coordinate: " + v);
        }
        String s = String.format(Locale.ROOT, "%.2f", v);
        if (s.contains(".")) {
            s = s.replaceAll("0+$", "").replaceAll("\\.$", "");
        }
        return s.equals("-0") ? "0" : s;
    }

    /** Escapes text and attribute values for XML. */
    static String escape(String s) {
        StringBuilder out = new StringBuilder(s.length());
        for (int i = 0; i < s.length(); i++) {
            char c = s.charAt(i);
            switch (c) {
                case '&' -> out.append("&amp;");
                case '<' -> out.append("&lt;");
                case '>' -> out.append("&gt;");
                case '"' -> out.append("&quot;");
                case '\'' -> out.append("&apos;");
                default -> {
                    if (c < 0x20 && c != '\t' && c != '\n' && c != '\r') {
                        out.append(' ');
                    } else {
                        out.append(c);
                    }
                }
            }
        }
        return out.toString();
    }

    private void indent() {
        sb.append("  ".repeat(depth));
    }

    /** Opens a group with a class (and optional style). */
    SvgWriter group(String cssClass, String style) {
        indent();
        sb.append("<g class=\"").append(escape(cssClass)).append('"');
        if (style != null) {
            sb.append(" style=\"").append(escape(style)).append('"');
        }
        sb.append(">\n");
        depth++;
        return this;
    }

    SvgWriter end() {
        depth--;
        indent();
        sb.append("</g>\n");
        return this;
    }

    SvgWriter line(double x1, double y1, double x2, double y2, String cssClass, String style) {
        indent();
        sb.append("<line class=\"").append(escape(cssClass)).append("\" x1=\"").append(n(x1)).append("\" y1=\"")
                .append(n(y1)).append("\" x2=\"").append(n(x2)).append("\" y2=\"").append(n(y2)).append('"');
        style(style);
        sb.append("/>\n");
        return this;
    }

    SvgWriter rect(double x, double y, double w, double h, String cssClass, String style) {
        indent();
        sb.append("<rect class=\"").append(escape(cssClass)).append("\" x=\"").append(n(x)).append("\" y=\"").append(n(y))
                .append("\" width=\"").append(n(Math.max(0, w))).append("\" height=\"").append(n(Math.max(0, h))).append('"');
        style(style);
        sb.append("/>\n");
        return this;
    }

    SvgWriter polyline(double[] x, double[] y, String cssClass, String style) {
        indent();
        sb.append("<polyline class=\"").append(escape(cssClass)).append("\" points=\"");
        for (int i = 0; i < x.length; i++) {
            if (i > 0) {
                sb.append(' ');
            }
            sb.append(n(x[i])).append(',').append(n(y[i]));
        }
        sb.append('"');
        style(style);
        sb.append("/>\n");
        return this;
    }

    /**
     * @param anchor start, middle or end
     * @param rotate degrees about the anchor point (0 for none)
     */
    SvgWriter text(double x, double y, String text, String anchor, double rotate, String cssClass, String style) {
        indent();
        sb.append("<text class=\"").append(escape(cssClass)).append("\" x=\"").append(n(x)).append("\" y=\"").append(n(y))
                .append("\" text-anchor=\"").append(anchor).append('"');
        if (rotate != 0) {
            sb.append(" transform=\"rotate(").append(n(rotate)).append(' ').append(n(x)).append(' ').append(n(y)).append(")\"");
        }
        style(style);
        sb.append('>').append(escape(text)).append("</text>\n");
        return this;
    }

    private void style(String style) {
        if (style != null) {
            sb.append(" style=\"").append(escape(style)).append('"');
        }
    }

    /** The finished document. */
    String finish() {
        while (depth > 1) {
            end();
        }
        return sb + "</svg>\n";
    }
}
