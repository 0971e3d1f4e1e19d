package dev.galebench.dashboard;

import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.util.HashMap;
import java.util.Map;
import java.util.Properties;

/**
 * The console's pages, scripts and styles, read from the classpath once at server start:
 * our own files from {@code dev/galebench/dashboard/web/}, uPlot from its webjar (brought in
 * by the build, never copied into the repository). Held as byte arrays, so serving a file
 * costs one buffer wrap and no disk or jar access per request.
 */
final class StaticResources {
    /** One servable file. */
    record Resource(byte[] bytes, String contentType, boolean immutable) {
    }

    private static final String OWN = "dev/galebench/dashboard/web/";
    private static final String UPLOT_POM = "META-INF/maven/org.webjars.npm/uplot/pom.properties";

    private final Map<String, Resource> byPath = new HashMap<>();
    private final String uplotVersion;

    StaticResources() {
        ClassLoader cl = StaticResources.class.getClassLoader();
        uplotVersion = webjarVersion(cl);
        String uplot = "META-INF/resources/webjars/uplot/" + uplotVersion + "/dist/";
        put(cl, "/", OWN + "index.html", "text/html; charset=utf-8", false);
        put(cl, "/index.html", OWN + "index.html", "text/html; charset=utf-8", false);
        put(cl, "/app.js", OWN + "app.js", "text/javascript; charset=utf-8", false);
        put(cl, "/style.css", OWN + "style.css", "text/css; charset=utf-8", false);
        put(cl, "/favicon.svg", OWN + "favicon.svg", "image/svg+xml", false);
        put(cl, "/vendor/uplot/uPlot.iife.min.js", uplot + "uPlot.iife.min.js", "text/javascript; charset=utf-8", true);
        put(cl, "/vendor/uplot/uPlot.min.css", uplot + "uPlot.min.css", "text/css; charset=utf-8", true);
        put(cl, "/vendor/uplot/LICENSE", "META-INF/resources/webjars/uplot/" + uplotVersion + "/LICENSE",
                "text/plain; charset=utf-8", true);
    }

    /** The file served at {@code path}, or null. */
    Resource get(String path) {
        return byPath.get(path);
    }

    String uplotVersion() {
        return uplotVersion;
    }

    private void put(ClassLoader cl, String path, String resource, String type, boolean immutable) {
        try (InputStream in = cl.getResourceAsStream(resource)) {
            if (in == null) {
                throw new IllegalStateException("dashboard resource missing from the classpath: " + resource);
            }
            byPath.put(path, new Resource(in.readAllBytes(), type, immutable));
        } catch (IOException e) {
            throw new UncheckedIOException("cannot read dashboard resource " + resource, e);
        }
    }

    private static String webjarVersion(ClassLoader cl) {
        try (InputStream in = cl.getResourceAsStream(UPLOT_POM)) {
            if (in == null) {
                throw new IllegalStateException("uPlot webjar (org.webjars.npm:uplot) is not on the classpath");
            }
            Properties p = new Properties();
            p.load(in);
            return p.getProperty("version");
        } catch (IOException e) {
            throw new UncheckedIOException("cannot read " + UPLOT_POM, e);
        }
    }
}
