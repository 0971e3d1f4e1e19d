package dev.galebench.report.plot;

import java.util.Locale;

/**
 * A minimal writer of SVG elements with escaped attributes and text, so plot code states
 * elements and attributes instead of concatenating markup. Numbers are written with at most
 * two decimals (a tenth of a pixel is below what a screen shows).
 */
final class SvgWriter {
    private final StringBuilder out = new StringBuilder(16 * 1024);

    SvgWriter open(String tag, String... attributes) {
        start(tag, attributes);
        out.append(">");
        return this;
    }

    SvgWriter empty(String tag, String... attributes) {
        start(tag, attributes);
        out.append("/>");
        return this;
    }

    SvgWriter close(String tag) {
        out.append("</").append(tag).append('>');
        return this;
    }

    SvgWriter text(String s) {
        out.append(escape(s));
        return this;
    }

    /** An element holding only text. */
    SvgWriter textElement(String tag, String text, String... attributes) {
        open(tag, attributes);
        text(text);
        return close(tag);
    }

    SvgWriter raw(String s) {
        out.append(s);
        return this;
    }

    private void start(String tag, String[] attributes) {
        if (attributes.length % 2 != 0) {
            throw new IllegalArgumentException("attributes come in name/value pairs");
        }
        out.append('<').append(tag);
        for (int i = 0; i < attributes.length; i += 2) {
            if (attributes[i + 1] == null) {
                continue;
            }
            out.append(' ').append(attributes[i]).append("=\"").append(escape(attributes[i + 1])).append('"');
        }
    }

    static String num(double v) {
        if (Math.abs(v - Math.rint(v)) < 0.005) {
            return Long.toString(Math.round(v));
        }
        return String.format(Locale.ROOT, "%.2f", v);
    }

    static String escape(String s) {
        if (s == null) {
            return "";
        }
        StringBuilder b = new StringBuilder(s.length() + 8);
        for (int i = 0; i < s.length(); i++) {
            char c = s.charAt(i);
            switch (c) {
                case '<' -> b.append("&lt;");
                case '>' -> b.append("&gt;");
                case '&' -> b.append("&amp;");
                case '"' -> b.append("&quot;");
                case '\'' -> b.append("&#39;");
                default -> {
                    if (c >= 0x20 || c == '\t' || c == '\n' || c == '\r') {
                        b.append(c);
                    }
                }
            }
        }
        return b.toString();
    }

    @Override
    public String toString() {
        return out.toString();
    }
}
