package dev.galebench.dashboard.support;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.WebSocket;
import java.net.http.WebSocketHandshakeException;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.CompletionException;
import java.util.concurrent.CompletionStage;
import java.util.concurrent.LinkedBlockingQueue;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.TimeoutException;
import java.util.function.Predicate;

/**
 * A console as a test sees it: a real WebSocket (JDK client) to {@code /ws}, every text message
 * parsed and queued. {@link #await} waits for a message of one type and returns it, keeping
 * everything it skipped in {@link #seen()} for later assertions.
 */
public final class ConsoleClient implements AutoCloseable {
    private static final ObjectMapper JSON = new ObjectMapper();
    private final LinkedBlockingQueue<JsonNode> inbox = new LinkedBlockingQueue<>();
    private final List<JsonNode> seen = new ArrayList<>();
    private final List<JsonNode> skipped = new ArrayList<>();
    private final WebSocket socket;
    private volatile boolean closed;

    private ConsoleClient(URI uri, String origin) {
        WebSocket.Builder b = HttpClient.newHttpClient().newWebSocketBuilder().connectTimeout(Duration.ofSeconds(5));
        if (origin != null) {
            b.header("Origin", origin);
        }
        this.socket = b.buildAsync(uri, new Listener()).join();
    }

    /** Opens a socket to {@code ws://127.0.0.1:port/ws?query}; throws {@link HandshakeRefused} on an HTTP error. */
    public static ConsoleClient open(int port, String query) {
        return open(port, query, null);
    }

    public static ConsoleClient open(int port, String query, String origin) {
        URI uri = URI.create("ws://127.0.0.1:" + port + "/ws" + (query == null || query.isEmpty() ? "" : "?" + query));
        try {
            return new ConsoleClient(uri, origin);
        } catch (CompletionException e) {
            if (e.getCause() instanceof WebSocketHandshakeException) {
                throw new HandshakeRefused(((WebSocketHandshakeException) e.getCause()).getResponse().statusCode());
            }
            throw e;
        }
    }

    /** The server answered the upgrade with an HTTP error. */
    public static final class HandshakeRefused extends RuntimeException {
        private final int status;

        HandshakeRefused(int status) {
            super("handshake refused with HTTP " + status);
            this.status = status;
        }

        public int status() {
            return status;
        }
    }

    /**
     * First message of {@code type} that satisfies {@code match} and was not returned before
     * (messages skipped by earlier calls are looked at first), or fails after {@code timeoutMs}.
     */
    public JsonNode await(String type, Predicate<JsonNode> match, long timeoutMs) throws InterruptedException, TimeoutException {
        for (int i = 0; i < skipped.size(); i++) {
            JsonNode m = skipped.get(i);
            if (type.equals(m.path("type").asText()) && match.test(m)) {
                skipped.remove(i);
                return m;
            }
        }
        long deadline = System.nanoTime() + TimeUnit.MILLISECONDS.toNanos(timeoutMs);
        while (true) {
            long left = deadline - System.nanoTime();
            JsonNode m = left <= 0 ? null : inbox.poll(left, TimeUnit.NANOSECONDS);
            if (m == null) {
                throw new TimeoutException("no '" + type + "' message within " + timeoutMs + " ms; saw " + types());
            }
            seen.add(m);
            if (type.equals(m.path("type").asText()) && match.test(m)) {
                return m;
            }
            skipped.add(m);
        }
    }

    public JsonNode await(String type) throws InterruptedException, TimeoutException {
        return await(type, m -> true, 5000);
    }

    /** Every message taken from the inbox so far, in arrival order. */
    public List<JsonNode> seen() {
        return seen;
    }

    /** Moves whatever arrived within {@code quietMs} into {@link #seen()}. */
    public void drain(long quietMs) throws InterruptedException {
        JsonNode m;
        while ((m = inbox.poll(quietMs, TimeUnit.MILLISECONDS)) != null) {
            seen.add(m);
            skipped.add(m);
        }
    }

    public void send(String text) {
        socket.sendText(text, true).join();
    }

    public boolean closedByServer() {
        return closed;
    }

    private String types() {
        StringBuilder s = new StringBuilder();
        for (JsonNode m : seen) {
            s.append(m.path("type").asText()).append(' ');
        }
        return s.toString().trim();
    }

    @Override
    public void close() {
        try {
            socket.sendClose(WebSocket.NORMAL_CLOSURE, "bye").get(2, TimeUnit.SECONDS);
        } catch (Exception e) {
            socket.abort();
        }
    }

    /** Drops the TCP connection without a close handshake, like a crashed browser. */
    public void abort() {
        socket.abort();
    }

    private final class Listener implements WebSocket.Listener {
        private final StringBuilder partial = new StringBuilder();

        @Override
        public CompletionStage<?> onText(WebSocket ws, CharSequence data, boolean last) {
            partial.append(data);
            if (last) {
                try {
                    inbox.add(JSON.readTree(partial.toString()));
                } catch (IOException e) {
                    throw new UncheckedIOException(e);
                }
                partial.setLength(0);
            }
            ws.request(1);
            return null;
        }

        @Override
        public CompletionStage<?> onClose(WebSocket ws, int statusCode, String reason) {
            closed = true;
            return null;
        }
    }
}
