package dev.galebench.dashboard;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import io.netty.channel.Channel;
import io.netty.channel.group.ChannelGroup;
import io.netty.channel.group.ChannelMatcher;
import io.netty.channel.group.DefaultChannelGroup;
import io.netty.handler.codec.http.websocketx.TextWebSocketFrame;
import io.netty.util.concurrent.GlobalEventExecutor;

import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayDeque;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ThreadLocalRandom;
import java.util.concurrent.atomic.AtomicLong;

/**
 * Fans telemetry out to every open console and keeps what a (re)connecting console needs to
 * catch up: the signal layout of the current stream, the last {@link #HISTORY_BATCHES} data
 * batches, the latest timing, the run state, its verdicts so far and the tail of the control log.
 *
 * <p>Why a history and not per-client queues: a browser that reconnects names the last batch it
 * has ({@code after}) and receives only the newer ones from the shared history, so resuming
 * costs no per-client state; a closed tab leaves the channel group by itself and costs nothing.
 * A viewer whose socket is not writable (slow network, hidden tab throttled) is skipped for
 * data batches (counted in {@link #slowViewerSkips()}) instead of growing a queue in the
 * server; state messages (verdicts, run state, log) are always sent.
 *
 * <p>Threading: called from the feed thread, the control thread and network threads; every
 * method is synchronized so a joining client sees each batch exactly once (snapshot and join
 * happen under the same lock as a publish). Writes only enqueue to Netty, so the lock is held
 * briefly. Messages are encoded once and shared by all sockets.
 */
final class TelemetryHub {
    /** Data batches kept for resuming clients (about 60 s at 10 batches per second). */
    static final int HISTORY_BATCHES = 600;
    private static final int LOG_LINES = 200;

    private final ObjectMapper json = new ObjectMapper();
    private final ChannelGroup viewers = new DefaultChannelGroup("galebench-dashboard", GlobalEventExecutor.INSTANCE);
    private final String epoch = Long.toHexString(ThreadLocalRandom.current().nextLong() & Long.MAX_VALUE);
    private final ArrayDeque<Batch> history = new ArrayDeque<>();
    private final List<String> verdictMessages = new ArrayList<>();
    private final ArrayDeque<String> logMessages = new ArrayDeque<>();
    private final Map<String, Path> reportDirs = new HashMap<>();
    private final AtomicLong slowViewerSkips = new AtomicLong();
    private final ChannelMatcher writableOnly = ch -> {
        if (ch.isWritable()) {
            return true;
        }
        slowViewerSkips.incrementAndGet();
        return false;
    };

    private long lastSeq;
    private int streamCount;
    private String streamId = "";
    private String layoutMessage;
    private String timingMessage;
    private String runMessage;
    private String sequencesMessage;
    private String controlsMessage;

    private record Batch(long seq, String message) {
    }

    TelemetryHub() {
        runMessage = runState("idle", null, null, null, null);
        sequencesMessage = message("sequences").set("sequences", json.createArrayNode()).toString();
        controlsMessage = controls(false, List.of()).toString();
    }

    String epoch() {
        return epoch;
    }

    synchronized int viewerCount() {
        return viewers.size();
    }

    long slowViewerSkips() {
        return slowViewerSkips.get();
    }

    synchronized long lastSeq() {
        return lastSeq;
    }

    synchronized String streamId() {
        return streamId;
    }

    /**
     * Adds a socket whose handshake just completed and sends it what it lacks. A client that
     * names the current stream and a batch still in the history gets only newer batches;
     * any other client gets the layout and the whole history.
     */
    synchronized void join(Channel ch, Access.Role role, boolean tokenRequired, String clientStreamId, long afterSeq) {
        ObjectNode hello = message("hello");
        hello.put("server", "galebench");
        hello.put("protocol", 1);
        hello.put("epoch", epoch);
        hello.put("role", role == Access.Role.CONTROL ? "control" : "view");
        hello.put("tokenRequired", tokenRequired);
        ch.write(frame(hello.toString()));
        ch.write(frame(controlsMessage));
        ch.write(frame(sequencesMessage));
        boolean resume = layoutMessage != null && streamId.equals(clientStreamId)
                && (history.isEmpty() || afterSeq >= history.peekFirst().seq() - 1);
        if (layoutMessage != null && !resume) {
            ch.write(frame(layoutMessage));
        }
        for (Batch b : history) {
            if (!resume || b.seq() > afterSeq) {
                ch.write(frame(b.message()));
            }
        }
        if (timingMessage != null) {
            ch.write(frame(timingMessage));
        }
        ch.write(frame(runMessage));
        for (String v : verdictMessages) {
            ch.write(frame(v));
        }
        for (String l : logMessages) {
            ch.write(frame(l));
        }
        ch.flush();
        viewers.add(ch);
    }

    /** What the bench can do; sent on join and when it changes. */
    synchronized void setControls(boolean interactive, List<String> linkFaults) {
        controlsMessage = controls(interactive, linkFaults).toString();
        broadcast(controlsMessage);
    }

    synchronized void setSequences(List<SequenceInfo> sequences) {
        ObjectNode m = message("sequences");
        ArrayNode list = m.putArray("sequences");
        for (SequenceInfo s : sequences) {
            ObjectNode e = list.addObject();
            e.put("name", s.name());
            e.put("description", s.description() == null ? "" : s.description());
            if (!Double.isNaN(s.durationS())) {
                e.put("durationS", s.durationS());
            }
        }
        sequencesMessage = m.toString();
        broadcast(sequencesMessage);
    }

    /** A new sample stream begins: new layout, history cleared. Returns the stream id. */
    synchronized String startStream(String[] names, String[] units, double bucketS, double exchangePeriodS) {
        streamCount++;
        streamId = epoch + "-" + streamCount;
        ObjectNode m = message("layout");
        m.put("stream", streamId);
        m.put("bucketS", bucketS);
        m.put("exchangePeriodS", exchangePeriodS);
        ArrayNode sig = m.putArray("signals");
        for (int i = 0; i < names.length; i++) {
            sig.addObject().put("name", names[i]).put("unit", units[i]);
        }
        layoutMessage = m.toString();
        history.clear();
        broadcast(layoutMessage);
        return streamId;
    }

    /**
     * Publishes one data batch. {@code body} is the JSON object's members after {@code seq}
     * (starting with a comma); the hub numbers batches so numbers never repeat in one epoch.
     */
    synchronized long publishData(CharSequence body) {
        long seq = ++lastSeq;
        String m = "{\"type\":\"data\",\"seq\":" + seq + ",\"stream\":\"" + streamId + "\"" + body + "}";
        history.addLast(new Batch(seq, m));
        if (history.size() > HISTORY_BATCHES) {
            history.removeFirst();
        }
        if (!viewers.isEmpty()) {
            viewers.writeAndFlush(frame(m), writableOnly);
        }
        return seq;
    }

    synchronized void publishTiming(String message) {
        timingMessage = message;
        broadcast(message);
    }

    /** Stream ended (run over); the layout and history stay for late viewers. */
    synchronized void endStream(long samplesMissed) {
        ObjectNode m = message("streamEnd");
        m.put("stream", streamId);
        m.put("samplesMissed", samplesMissed);
        broadcast(m.toString());
    }

    synchronized void sequenceStarted(String sequence, String runId, List<String> checks) {
        verdictMessages.clear();
        ObjectNode m = runStateNode("running", sequence, runId, null, null);
        ArrayNode pending = m.putArray("checks");
        for (String c : checks) {
            pending.add(c);
        }
        runMessage = m.toString();
        broadcast(runMessage);
    }

    synchronized void verdict(Verdict v, double plantTimeS) {
        ObjectNode m = message("verdict");
        m.put("name", v.name());
        m.put("kind", v.kind());
        m.put("passed", v.passed());
        m.put("measured", v.measured());
        m.put("required", v.required());
        m.put("message", v.message());
        if (!Double.isNaN(plantTimeS)) {
            m.put("tS", plantTimeS);
        }
        String s = m.toString();
        verdictMessages.add(s);
        broadcast(s);
    }

    /**
     * The sequence ended. {@code outcome} is {@code passed}, {@code failed} or {@code aborted};
     * a non-null {@code reportDir} is served under {@code /runs/<runId>/}.
     */
    synchronized void sequenceFinished(String sequence, String runId, String outcome, Path reportDir, String reportFile) {
        String url = null;
        if (reportDir != null && runId != null) {
            reportDirs.put(runId, reportDir.toAbsolutePath().normalize());
            url = "/runs/" + runId + "/" + (reportFile == null ? "report.html" : reportFile);
        }
        runMessage = runState(outcome, sequence, runId, url, Instant.now().toString());
        broadcast(runMessage);
    }

    synchronized Path reportDir(String runId) {
        return reportDirs.get(runId);
    }

    /** One line of the control log: who asked what and what the bench answered. */
    synchronized void log(String role, String text, boolean accepted) {
        ObjectNode m = message("log");
        m.put("at", Instant.now().toString());
        m.put("role", role);
        m.put("text", text);
        m.put("accepted", accepted);
        String s = m.toString();
        logMessages.addLast(s);
        if (logMessages.size() > LOG_LINES) {
            logMessages.removeFirst();
        }
        broadcast(s);
    }

    /** Closes every socket (server shutdown). */
    synchronized void closeAll() {
        viewers.close();
    }

    ObjectNode message(String type) {
        ObjectNode m = json.createObjectNode();
        m.put("type", type);
        return m;
    }

    ObjectMapper json() {
        return json;
    }

    private ObjectNode controls(boolean interactive, List<String> linkFaults) {
        ObjectNode m = message("controls");
        m.put("interactive", interactive);
        ArrayNode f = m.putArray("linkFaults");
        for (String s : linkFaults) {
            f.add(s);
        }
        return m;
    }

    private String runState(String state, String sequence, String runId, String reportUrl, String endedAt) {
        return runStateNode(state, sequence, runId, reportUrl, endedAt).toString();
    }

    private ObjectNode runStateNode(String state, String sequence, String runId, String reportUrl, String endedAt) {
        ObjectNode m = message("run");
        m.put("state", state);
        if (sequence != null) {
            m.put("sequence", sequence);
        }
        if (runId != null) {
            m.put("runId", runId);
        }
        if (reportUrl != null) {
            m.put("report", reportUrl);
        }
        if (endedAt != null) {
            m.put("endedAt", endedAt);
        }
        return m;
    }

    private void broadcast(String message) {
        if (!viewers.isEmpty()) {
            viewers.writeAndFlush(frame(message));
        }
    }

    private static TextWebSocketFrame frame(String message) {
        return new TextWebSocketFrame(message);
    }
}
