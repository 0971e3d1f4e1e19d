package dev.galebench.runner;

import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.util.Map;

/**
 * A page fragment kept as a classpath resource under {@code /dev/galebench/runner/}:
 * {@code {{name}}} is replaced HTML-escaped, {@code {{{name}}}} as is (rendered fragments, SVG).
 * A placeholder without a value is an error.
 */
final class Page {
    private Page() {
    }

    static String resource(String absoluteName) {
        try (InputStream in = Page.class.getResourceAsStream(absoluteName)) {
            if (in == null) {
                throw new IllegalStateException("resource missing from the classpath: " + absoluteName);
            }
            return new String(in.readAllBytes(), StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    static String render(String template, Map<String, String> values) {
        String text = resource("/dev/galebench/runner/" + template);
        StringBuilder out = new StringBuilder(text.length() + 256);
        int i = 0;
        while (true) {
            int open = text.indexOf("{{", i);
            if (open < 0) {
                return out.append(text, i, text.length()).toString();
            }
            out.append(text, i, open);
            boolean raw = text.startsWith("{{{", open);
            int close = text.indexOf(raw ? "}}}" : "}}", open);
            String key = text.substring(open + (raw ? 3 : 2), close).trim();
            String v = values.get(key);
            if (v == null) {
                throw new IllegalStateException(template + ": no value for {{" + key + "}}");
            }
            out.append(raw ? v : v.replace("&", "&amp;").replace("<", "&lt;").replace(">", "&gt;").replace("\"", "&quot;"));
            i = close + (raw ? 3 : 2);
        }
    }
}
