package dev.galebench.report;

import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;

/**
 * A page or fragment template kept as a classpath resource under
 * {@code /dev/galebench/report/html/}, so the report's markup and style live in files a
 * designer can edit, not in Java strings. Syntax: {@code {{name}}} is replaced by the value
 * HTML-escaped, {@code {{{name}}}} by the value as is (for fragments already rendered from
 * other templates, and for SVG made by {@link dev.galebench.report.plot.SvgLinePlot}). A
 * placeholder without a value is an error, so a renamed key cannot silently vanish from a page.
 */
final class Template {
    private static final Map<String, String> CACHE = new ConcurrentHashMap<>();
    private final String name;
    private final String text;

    private Template(String name, String text) {
        this.name = name;
        this.text = text;
    }

    static Template of(String resourceName) {
        return new Template(resourceName, CACHE.computeIfAbsent(resourceName, Template::load));
    }

    static String resource(String resourceName) {
        return CACHE.computeIfAbsent(resourceName, Template::load);
    }

    private static String load(String resourceName) {
        try (InputStream in = Template.class.getResourceAsStream("/dev/galebench/report/html/" + resourceName)) {
            if (in == null) {
                throw new IllegalStateException("report template missing from the classpath: " + resourceName);
            }
            return new String(in.readAllBytes(), StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    String render(Map<String, String> values) {
        StringBuilder out = new StringBuilder(text.length() + 256);
        int i = 0;
        while (true) {
            int open = text.indexOf("{{", i);
            if (open < 0) {
                out.append(text, i, text.length());
                return out.toString();
            }
            out.append(text, i, open);
            boolean raw = text.startsWith("{{{", open);
            int close = text.indexOf(raw ? "}}}" : "}}", open);
            if (close < 0) {
                throw new IllegalStateException(name + ": unclosed placeholder at offset " + open);
            }
            String key = text.substring(open + (raw ? 3 : 2), close).trim();
            String value = values.get(key);
            if (value == null) {
                throw new IllegalStateException(name + ": no value for placeholder '" + key + "'");
            }
            out.append(raw ? value : escape(value));
            i = close + (raw ? 3 : 2);
        }
    }

    static String escape(String s) {
        StringBuilder b = new StringBuilder(s.length() + 8);
        for (int k = 0; k < s.length(); k++) {
            char c = s.charAt(k);
            switch (c) {
                case '<' -> b.append("&lt;");
                case '>' -> b.append("&gt;");
                case '&' -> b.append("&amp;");
                case '"' -> b.append("&quot;");
                case '\'' -> b.append("&#39;");
                default -> b.append(c);
            }
        }
        return b.toString();
    }
}
