package dev.galebench.dashboard;

import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;

import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** Pages and uPlot over a real server and the JDK's HTTP client. */
class StaticPagesTest {
    private Dashboard dashboard;
    private final HttpClient http = HttpClient.newHttpClient();

    @BeforeEach
    void start() {
        dashboard = Dashboard.start(DashboardOptions.loopback(0), null, null);
    }

    @AfterEach
    void stop() {
        dashboard.close();
    }

    private HttpResponse<String> get(String path) throws Exception {
        return http.send(HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + dashboard.port() + path)).build(),
                HttpResponse.BodyHandlers.ofString());
    }

    @Test
    void shouldServeTheConsolePageWithItsScriptsAndStyles() throws Exception {
        HttpResponse<String> page = get("/");
        assertEquals(200, page.statusCode());
        assertTrue(page.body().contains("/vendor/uplot/uPlot.iife.min.js"));
        assertTrue(page.body().contains("/app.js"));
        assertTrue(page.headers().firstValue("content-security-policy").orElse("").contains("default-src 'self'"));
        HttpResponse<String> app = get("/app.js");
        assertEquals(200, app.statusCode());
        assertEquals("text/javascript; charset=utf-8", app.headers().firstValue("content-type").orElse(""));
        assertTrue(app.body().contains("new WebSocket("));
        assertEquals(200, get("/style.css").statusCode());
    }

    @Test
    void shouldServeUplotFromItsWebjar() throws Exception {
        HttpResponse<String> js = get("/vendor/uplot/uPlot.iife.min.js");
        assertEquals(200, js.statusCode());
        assertTrue(js.body().length() > 40_000, "the minified library, not a placeholder");
        assertTrue(js.body().contains("uPlot"));
        assertTrue(get("/vendor/uplot/uPlot.min.css").body().contains(".uplot"));
    }

    @Test
    void shouldAnswerUnknownPathsAndMethodsWithErrors() throws Exception {
        assertEquals(404, get("/nope.js").statusCode());
        assertEquals(404, get("/../pom.xml").statusCode());
        HttpResponse<String> post = http.send(HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + dashboard.port() + "/"))
                .POST(HttpRequest.BodyPublishers.ofString("x")).build(), HttpResponse.BodyHandlers.ofString());
        assertEquals(405, post.statusCode());
    }

    @Test
    void shouldRefuseToStartOnAPortInUse() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> Dashboard.start(DashboardOptions.loopback(dashboard.port()), null, null));
        assertTrue(e.getMessage().contains("cannot listen"), e.getMessage());
    }
}
