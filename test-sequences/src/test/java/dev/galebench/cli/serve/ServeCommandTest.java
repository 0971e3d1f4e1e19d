package dev.galebench.cli.serve;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import picocli.CommandLine;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.WebSocket;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.CompletionStage;
import java.util.concurrent.LinkedBlockingQueue;
import java.util.concurrent.TimeUnit;
import java.util.function.Predicate;
import java.util.stream.Collectors;
import java.util.stream.Stream;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * {@code galebench serve} end to end in one process: the real plant in real time with the
 * in-process virtual board, the console on a real socket, bench controls sent as a browser
 * would, their effect seen in the live data and in {@code controls.log}.
 */
class ServeCommandTest {
    private static final ObjectMapper JSON = new ObjectMapper();

    @Test
    void shouldDriveTheLivePlantFromTheConsoleAndLogEveryControl(@TempDir Path runs) throws Exception {
        ServeCommand serve = new ServeCommand();
        StringWriter out = new StringWriter();
        CommandLine cl = new CommandLine(serve);
        cl.setOut(new PrintWriter(out, true));
        CompletableFuture<Integer> exit = CompletableFuture.supplyAsync(() ->
                cl.execute("--port", "0", "--runs", runs.toString(), "--wind", "9"));
        try {
            long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(20);
            while (serve.port() < 0) {
                assertTrue(System.nanoTime() < deadline, "serve did not start: " + out);
                Thread.sleep(20);
            }
            LinkedBlockingQueue<JsonNode> inbox = new LinkedBlockingQueue<>();
            WebSocket ws = HttpClient.newHttpClient().newWebSocketBuilder()
                    .buildAsync(URI.create("ws://127.0.0.1:" + serve.port() + "/ws"), new Collector(inbox)).join();

            assertTrue(await(inbox, "controls", m -> true).get("interactive").asBoolean());
            JsonNode layout = await(inbox, "layout", m -> true);
            List<String> names = JSON.convertValue(layout.get("signals").findValues("name"), List.class);
            assertTrue(names.contains("wind_m_s") && names.contains("v_source_pu"), names.toString());
            int wind = names.indexOf("wind_m_s");
            int source = names.indexOf("v_source_pu");

            ws.sendText("{\"type\":\"control\",\"id\":1,\"action\":\"wind\",\"windMPerS\":14.5}", true).join();
            JsonNode ack = await(inbox, "ack", m -> m.path("id").asInt() == 1);
            assertTrue(ack.get("accepted").asBoolean(), ack.toString());
            assertTrue(ack.get("message").asText().contains("applied at plant t"), ack.toString());
            await(inbox, "data", m -> m.get("max").get(wind).size() > 0
                    && m.get("max").get(wind).get(m.get("max").get(wind).size() - 1).asDouble() == 14.5);

            ws.sendText("{\"type\":\"control\",\"id\":2,\"action\":\"voltage\",\"levelPu\":0.6,\"durationS\":0.3}", true).join();
            assertTrue(await(inbox, "ack", m -> m.path("id").asInt() == 2).get("accepted").asBoolean());
            await(inbox, "data", m -> {
                for (JsonNode v : m.get("min").get(source)) {
                    if (Math.abs(v.asDouble() - 0.6) < 1e-6) {
                        return true;
                    }
                }
                return false;
            });

            ws.sendText("{\"type\":\"control\",\"id\":3,\"action\":\"linkfault\",\"fault\":\"drop-50pct\",\"durationS\":0.2}", true).join();
            assertTrue(await(inbox, "ack", m -> m.path("id").asInt() == 3).get("accepted").asBoolean());
            await(inbox, "timing", m -> m.has("link") && m.get("link").get("missingReplies").asLong() > 0);

            ws.sendText("{\"type\":\"control\",\"id\":4,\"action\":\"vdevref\",\"referencePu\":0.03}", true).join();
            assertTrue(await(inbox, "ack", m -> m.path("id").asInt() == 4).get("accepted").asBoolean());
            ws.sendClose(WebSocket.NORMAL_CLOSURE, "bye").join();
        } finally {
            serve.stop();
        }
        assertEquals(0, exit.get(30, TimeUnit.SECONDS));
        Path log;
        try (Stream<Path> s = Files.list(runs)) {
            log = s.filter(p -> p.getFileName().toString().startsWith("serve-")).findFirst().orElseThrow().resolve("controls.log");
        }
        List<String> lines = Files.readAllLines(log);
        String all = lines.stream().collect(Collectors.joining("\n"));
        assertNotNull(all);
        assertTrue(all.contains("wind 14.50 m/s, applied at plant t ="), all);
        assertTrue(all.contains("dip: source 0.600 pu for 0.300 s, applied"), all);
        assertTrue(all.contains("link fault drop-50pct for 0.200 s, applied"), all);
        assertTrue(all.contains("voltage-deviation reference 0.030 pu, applied"), all);
        assertTrue(lines.get(lines.size() - 1).endsWith("session closed"), all);
        assertTrue(out.toString().contains("galebench serve: live console at http://127.0.0.1:"), out.toString());
    }

    @Test
    void shouldRunALibrarySequenceFromTheConsoleAbortItAndResumeTheBench(@TempDir Path runs) throws Exception {
        ServeCommand serve = new ServeCommand();
        CommandLine cl = new CommandLine(serve);
        cl.setOut(new PrintWriter(new StringWriter(), true));
        CompletableFuture<Integer> exit = CompletableFuture.supplyAsync(() ->
                cl.execute("--port", "0", "--runs", runs.toString(), "--hold-s", "0"));
        try {
            long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(20);
            while (serve.port() < 0) {
                assertTrue(System.nanoTime() < deadline, "serve did not start");
                Thread.sleep(20);
            }
            LinkedBlockingQueue<JsonNode> inbox = new LinkedBlockingQueue<>();
            WebSocket ws = HttpClient.newHttpClient().newWebSocketBuilder()
                    .buildAsync(URI.create("ws://127.0.0.1:" + serve.port() + "/ws"), new Collector(inbox)).join();
            assertTrue(await(inbox, "controls", m -> true).get("interactive").asBoolean());
            ws.sendText("{\"type\":\"control\",\"id\":1,\"action\":\"start\",\"sequence\":\"wind-ramp-to-rated\"}", true).join();
            assertTrue(await(inbox, "ack", m -> m.path("id").asInt() == 1).get("accepted").asBoolean());
            JsonNode running = await(inbox, "run", m -> "running".equals(m.get("state").asText()));
            assertEquals("wind-ramp-to-rated", running.get("sequence").asText());
            assertTrue(running.get("checks").size() > 0, "the sequence's checks are listed as pending");
            // once the sequence's loop runs, the runner's bench answers: not interactive, abort offered
            await(inbox, "controls", m -> !m.get("interactive").asBoolean());
            ws.sendText("{\"type\":\"control\",\"id\":2,\"action\":\"wind\",\"windMPerS\":12}", true).join();
            assertTrue(!await(inbox, "ack", m -> m.path("id").asInt() == 2).get("accepted").asBoolean(),
                    "bench controls are refused while a sequence owns the plant");
            ws.sendText("{\"type\":\"control\",\"id\":3,\"action\":\"abort\"}", true).join();
            assertTrue(await(inbox, "ack", m -> m.path("id").asInt() == 3).get("accepted").asBoolean());
            assertTrue(await(inbox, "verdict", m -> true).has("passed"), "verdicts are published, then the end state");
            JsonNode ended = await(inbox, "run", m -> !"running".equals(m.get("state").asText()));
            assertEquals("aborted", ended.get("state").asText());
            assertTrue(ended.get("report").asText().endsWith("/report.html"), ended.toString());
            await(inbox, "controls", m -> m.get("interactive").asBoolean()); // the serve bench is back
            await(inbox, "layout", m -> true); // and the free run streams again
            ws.sendClose(WebSocket.NORMAL_CLOSURE, "bye").join();
        } finally {
            serve.stop();
        }
        assertEquals(0, exit.get(60, TimeUnit.SECONDS));
        Path session;
        try (Stream<Path> s = Files.list(runs)) {
            session = s.findFirst().orElseThrow();
        }
        try (Stream<Path> s = Files.list(session)) {
            assertTrue(s.anyMatch(p -> p.getFileName().toString().startsWith("wind-ramp-to-rated")
                    && Files.isRegularFile(p.resolve("report.html"))));
        }
        String log = Files.readString(session.resolve("controls.log"));
        assertTrue(log.contains("sequence wind-ramp-to-rated aborted"), log);
    }

    @Test
    void shouldRefuseNonLoopbackWithoutTokenWithExitCodeTwo() {
        StringWriter err = new StringWriter();
        CommandLine cl = dev.galebench.cli.GalebenchCommand.commandLine();
        cl.setErr(new PrintWriter(err, true));
        int code = cl.execute("serve", "--bind", "0.0.0.0", "--port", "0");
        assertEquals(2, code);
        assertTrue(err.toString().contains("requires --token"), err.toString());
    }

    private static JsonNode await(LinkedBlockingQueue<JsonNode> inbox, String type, Predicate<JsonNode> match) throws Exception {
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(20);
        while (true) {
            JsonNode m = inbox.poll(Math.max(1, deadline - System.nanoTime()), TimeUnit.NANOSECONDS);
            if (m == null) {
                throw new AssertionError("no matching '" + type + "' message in 20 s");
            }
            if (type.equals(m.path("type").asText()) && match.test(m)) {
                return m;
            }
        }
    }

    /** Parses each text message into the inbox. */
    private static final class Collector implements WebSocket.Listener {
        private final LinkedBlockingQueue<JsonNode> inbox;
        private final StringBuilder partial = new StringBuilder();

        Collector(LinkedBlockingQueue<JsonNode> inbox) {
            this.inbox = inbox;
        }

        @Override
        public CompletionStage<?> onText(WebSocket ws, CharSequence data, boolean last) {
            partial.append(data);
            if (last) {
                try {
                    inbox.add(JSON.readTree(partial.toString()));
                } catch (java.io.IOException e) {
                    throw new java.io.UncheckedIOException(e);
                }
                partial.setLength(0);
            }
            ws.request(1);
            return null;
        }
    }
}
