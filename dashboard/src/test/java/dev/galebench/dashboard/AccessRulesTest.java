package dev.galebench.dashboard;

import com.fasterxml.jackson.databind.JsonNode;
import dev.galebench.dashboard.support.ConsoleClient;
import dev.galebench.dashboard.support.RecordingBench;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;

import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** Token rules, role checks and argument checks, over a real server and real sockets. */
class AccessRulesTest {
    private static final String TOKEN = "s3cret-bench-token";
    private Dashboard dashboard;

    @AfterEach
    void stop() {
        if (dashboard != null) {
            dashboard.close();
        }
    }

    private Dashboard start(DashboardOptions o, RecordingBench bench) {
        dashboard = Dashboard.start(o, bench, null);
        return dashboard;
    }

    @Test
    void shouldRefuseNonLoopbackBindWithoutToken() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> DashboardOptions.loopback(0).withBindAddress("0.0.0.0").validated());
        assertTrue(e.getMessage().contains("requires --token"), e.getMessage());
        DashboardOptions.loopback(0).withBindAddress("0.0.0.0").withToken(TOKEN, false).validated();
    }

    @Test
    void shouldRejectShortTokenAndViewersWithoutToken() {
        assertThrows(IllegalArgumentException.class, () -> DashboardOptions.loopback(0).withToken("short", false).validated());
        assertThrows(IllegalArgumentException.class, () -> DashboardOptions.loopback(0).withToken(null, true).validated());
    }

    @Test
    void shouldRefuseWebSocketWithoutOrWithWrongTokenWhenOneIsSet() {
        Dashboard d = start(DashboardOptions.loopback(0).withToken(TOKEN, false), new RecordingBench(true));
        assertEquals(401, assertThrows(ConsoleClient.HandshakeRefused.class, () -> ConsoleClient.open(d.port(), "")).status());
        assertEquals(401, assertThrows(ConsoleClient.HandshakeRefused.class,
                () -> ConsoleClient.open(d.port(), "token=wrong-token-123")).status());
        assertEquals(0, d.viewerCount());
    }

    @Test
    void shouldRefuseWrongTokenEvenWhenViewersAreAllowed() {
        Dashboard d = start(DashboardOptions.loopback(0).withToken(TOKEN, true), new RecordingBench(true));
        assertEquals(401, assertThrows(ConsoleClient.HandshakeRefused.class,
                () -> ConsoleClient.open(d.port(), "token=wrong-token-123")).status());
    }

    @Test
    void shouldRefuseCrossOriginWebSocket() throws Exception {
        Dashboard d = start(DashboardOptions.loopback(0), new RecordingBench(true));
        assertEquals(403, assertThrows(ConsoleClient.HandshakeRefused.class,
                () -> ConsoleClient.open(d.port(), "", "http://evil.example")).status());
        try (ConsoleClient same = ConsoleClient.open(d.port(), "", "http://127.0.0.1:" + d.port())) {
            assertEquals("control", same.await("hello").get("role").asText());
        }
    }

    @Test
    void shouldLetViewersWatchButNeverAct() throws Exception {
        RecordingBench bench = new RecordingBench(true);
        Dashboard d = start(DashboardOptions.loopback(0).withToken(TOKEN, true), bench);
        try (ConsoleClient viewer = ConsoleClient.open(d.port(), "")) {
            assertEquals("view", viewer.await("hello").get("role").asText());
            assertEquals(2, viewer.await("sequences").get("sequences").size());
            // even a viewer that knows the token cannot act over a viewer socket: role comes from the handshake
            viewer.send("{\"type\":\"control\",\"id\":1,\"token\":\"" + TOKEN + "\",\"action\":\"start\",\"sequence\":\"wind-step\"}");
            JsonNode ack = viewer.await("ack");
            assertFalse(ack.get("accepted").asBoolean());
            assertTrue(ack.get("message").asText().contains("read-only"));
        }
        assertEquals(List.of(), bench.calls());
    }

    @Test
    void shouldRequireTheTokenInEveryControlMessage() throws Exception {
        RecordingBench bench = new RecordingBench(true);
        Dashboard d = start(DashboardOptions.loopback(0).withToken(TOKEN, false), bench);
        try (ConsoleClient c = ConsoleClient.open(d.port(), "token=" + TOKEN)) {
            assertEquals("control", c.await("hello").get("role").asText());
            c.send("{\"type\":\"control\",\"id\":1,\"action\":\"wind\",\"windMPerS\":12}");
            JsonNode refused = c.await("ack");
            assertEquals(1, refused.get("id").asInt());
            assertFalse(refused.get("accepted").asBoolean());
            c.send("{\"type\":\"control\",\"id\":2,\"token\":\"" + TOKEN + "\",\"action\":\"wind\",\"windMPerS\":12}");
            JsonNode taken = c.await("ack");
            assertEquals(2, taken.get("id").asInt());
            assertTrue(taken.get("accepted").asBoolean(), taken.toString());
            JsonNode log = c.await("log", m -> m.get("text").asText().startsWith("wind 12.00 m/s"), 5000);
            assertTrue(log.get("accepted").asBoolean());
        }
        assertEquals(List.of("wind 12.00"), bench.calls());
    }

    @Test
    void shouldPassEveryControlToTheBenchAndRefuseOutOfRangeArguments() throws Exception {
        RecordingBench bench = new RecordingBench(true);
        Dashboard d = start(DashboardOptions.loopback(0), bench);
        try (ConsoleClient c = ConsoleClient.open(d.port(), "")) {
            c.await("hello");
            assertTrue(c.await("controls").get("interactive").asBoolean());
            String[] requests = {
                "{\"type\":\"control\",\"id\":1,\"action\":\"start\",\"sequence\":\"deep-dip\"}",
                "{\"type\":\"control\",\"id\":2,\"action\":\"voltage\",\"levelPu\":0.2,\"durationS\":0.15}",
                "{\"type\":\"control\",\"id\":3,\"action\":\"vdevref\",\"referencePu\":0.05}",
                "{\"type\":\"control\",\"id\":4,\"action\":\"linkfault\",\"fault\":\"silence\",\"durationS\":0.5}",
                "{\"type\":\"control\",\"id\":5,\"action\":\"abort\"}",
                "{\"type\":\"control\",\"id\":6,\"action\":\"wind\",\"windMPerS\":99}",
                "{\"type\":\"control\",\"id\":7,\"action\":\"voltage\",\"levelPu\":1.0,\"durationS\":0.1}",
                "{\"type\":\"control\",\"id\":8,\"action\":\"launch\"}",
                "not json"};
            for (String r : requests) {
                c.send(r);
            }
            for (int id = 1; id <= 5; id++) {
                final int want = id;
                JsonNode a = c.await("ack", m -> m.path("id").asInt() == want, 5000);
                assertTrue(a.get("accepted").asBoolean(), a.toString());
            }
            for (int id = 6; id <= 8; id++) {
                final int want = id;
                assertFalse(c.await("ack", m -> m.path("id").asInt() == want, 5000).get("accepted").asBoolean());
            }
            assertFalse(c.await("ack", m -> !m.has("id"), 5000).get("accepted").asBoolean());
        }
        assertEquals(List.of("start deep-dip", "voltage 0.200 0.150", "vdevref 0.050", "linkfault silence 0.500", "abort"),
                bench.calls());
    }

    @Test
    void shouldRefuseBenchControlsWhenTheBenchIsNotInteractive() throws Exception {
        RecordingBench bench = new RecordingBench(false);
        Dashboard d = start(DashboardOptions.loopback(0), bench);
        try (ConsoleClient c = ConsoleClient.open(d.port(), "")) {
            c.await("hello");
            c.send("{\"type\":\"control\",\"id\":1,\"action\":\"wind\",\"windMPerS\":10}");
            JsonNode a = c.await("ack");
            assertFalse(a.get("accepted").asBoolean());
            assertTrue(a.get("message").asText().contains("interactive"));
        }
        assertEquals(List.of(), bench.calls());
    }

    @Test
    void shouldServeRunFolderOnlyWithTheTokenAndNeverOutsideIt() throws Exception {
        Path dir = Files.createTempDirectory("galebench-run");
        Files.writeString(dir.resolve("report.html"), "<html><body>run report</body></html>");
        Files.writeString(dir.getParent().resolve("outside-" + dir.getFileName() + ".txt"), "secret");
        Dashboard d = start(DashboardOptions.loopback(0).withToken(TOKEN, false), new RecordingBench(true));
        d.sequenceFinished("deep-dip", "run-7", "passed", dir, null);
        HttpClient http = HttpClient.newHttpClient();
        String base = "http://127.0.0.1:" + d.port();
        assertEquals(401, get(http, base + "/runs/run-7/report.html").statusCode());
        HttpResponse<String> ok = get(http, base + "/runs/run-7/report.html?token=" + TOKEN);
        assertEquals(200, ok.statusCode());
        assertTrue(ok.body().contains("run report"));
        assertEquals("text/html; charset=utf-8", ok.headers().firstValue("content-type").orElse(""));
        assertEquals(404, get(http, base + "/runs/run-7/..%2F" + "outside-" + dir.getFileName() + ".txt?token=" + TOKEN).statusCode());
        assertEquals(404, get(http, base + "/runs/run-7/../outside-" + dir.getFileName() + ".txt?token=" + TOKEN).statusCode());
        assertEquals(404, get(http, base + "/runs/run-8/report.html?token=" + TOKEN).statusCode());
    }

    static HttpResponse<String> get(HttpClient http, String url) throws Exception {
        return http.send(HttpRequest.newBuilder(URI.create(url)).GET().build(), HttpResponse.BodyHandlers.ofString());
    }
}
