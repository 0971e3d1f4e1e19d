package dev.galebench.dashboard;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import io.netty.channel.Channel;
import io.netty.handler.codec.http.websocketx.TextWebSocketFrame;

import java.util.Locale;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.RejectedExecutionException;
import java.util.concurrent.TimeUnit;

/**
 * Turns control messages from browsers into {@link BenchControl} calls. Checks, in order: the
 * socket's role (viewers cannot act), the token the message carries, the action name and
 * its arguments (ranges below); then runs the call on one control thread, so requests are
 * served in arrival order and a slow bench never stalls a network thread. Every request,
 * taken or refused, goes to the control log every console shows; the asker gets an
 * {@code ack} with the bench's answer.
 *
 * <table>
 *   <caption>Argument ranges (checked before the bench sees them)</caption>
 *   <tr><th>action</th><th>argument</th><th>unit</th><th>range</th></tr>
 *   <tr><td>wind</td><td>windMPerS</td><td>m/s</td><td>0 .. 40</td></tr>
 *   <tr><td>voltage</td><td>levelPu</td><td>pu</td><td>0 .. 1.5, not 1</td></tr>
 *   <tr><td>voltage</td><td>durationS</td><td>s</td><td>&gt; 0 .. 60</td></tr>
 *   <tr><td>vdevref</td><td>referencePu</td><td>pu</td><td>-0.5 .. 0.5</td></tr>
 *   <tr><td>linkfault</td><td>durationS</td><td>s</td><td>&gt; 0 .. 60</td></tr>
 * </table>
 */
final class ControlDispatcher implements AutoCloseable {
    private final TelemetryHub hub;
    private final Access access;
    private final ExecutorService controlThread = Executors.newSingleThreadExecutor(r -> {
        Thread t = new Thread(r, "galebench-dashboard-control");
        t.setDaemon(true);
        return t;
    });
    private volatile BenchControl bench;

    ControlDispatcher(TelemetryHub hub, Access access, BenchControl bench) {
        this.hub = hub;
        this.access = access;
        this.bench = bench;
    }

    void bench(BenchControl b) {
        this.bench = b;
    }

    BenchControl bench() {
        return bench;
    }

    /** Handles one text message from a socket whose role is {@code role}. */
    void onMessage(Channel ch, Access.Role role, String text) {
        JsonNode m;
        try {
            m = hub.json().readTree(text);
        } catch (JsonProcessingException e) {
            ack(ch, null, false, "message is not JSON");
            return;
        }
        if (m == null || !m.isObject() || !"control".equals(m.path("type").asText())) {
            ack(ch, m == null ? null : m.get("id"), false, "unknown message type");
            return;
        }
        JsonNode id = m.get("id");
        String action = m.path("action").asText("");
        if (role != Access.Role.CONTROL) {
            hub.log("view", action + " refused: read-only viewer", false);
            ack(ch, id, false, "this console is a read-only viewer");
            return;
        }
        JsonNode tok = m.get("token");
        if (!access.controlAllowed(tok == null || tok.isNull() ? null : tok.asText())) {
            hub.log("control", action + " refused: missing or wrong token", false);
            ack(ch, id, false, "control requests must carry the valid token");
            return;
        }
        final Request req;
        try {
            req = parse(action, m);
        } catch (IllegalArgumentException e) {
            hub.log("control", action + " refused: " + e.getMessage(), false);
            ack(ch, id, false, e.getMessage());
            return;
        }
        try {
            controlThread.execute(() -> run(ch, id, req));
        } catch (RejectedExecutionException e) {
            ack(ch, id, false, "console is shutting down");
        }
    }

    private void run(Channel ch, JsonNode id, Request req) {
        BenchControl b = bench;
        ControlResult r;
        if (b == null) {
            r = ControlResult.refused("no bench attached");
        } else if (req.needsInteractive && !b.interactive()) {
            r = ControlResult.refused("bench controls are only available in interactive mode (galebench serve)");
        } else {
            try {
                r = req.call(b);
            } catch (RuntimeException e) {
                r = ControlResult.refused("bench error: " + e.getMessage());
            }
            if (r == null) {
                r = ControlResult.refused("bench gave no answer");
            }
        }
        hub.log("control", r.message().startsWith(req.describe) ? r.message() : req.describe + " -> " + r.message(), r.accepted());
        ack(ch, id, r.accepted(), r.message());
    }

    private void ack(Channel ch, JsonNode id, boolean accepted, String message) {
        ObjectNode a = hub.message("ack");
        if (id != null) {
            a.set("id", id);
        }
        a.put("accepted", accepted);
        a.put("message", message);
        ch.writeAndFlush(new TextWebSocketFrame(a.toString()));
    }

    /** A validated request: what to call and how to describe it in the log. */
    private abstract static class Request {
        final String describe;
        final boolean needsInteractive;

        Request(String describe, boolean needsInteractive) {
            this.describe = describe;
            this.needsInteractive = needsInteractive;
        }

        abstract ControlResult call(BenchControl b);
    }

    private static Request parse(String action, JsonNode m) {
        switch (action) {
            case "start": {
                String name = m.path("sequence").asText("");
                if (name.isEmpty()) {
                    throw new IllegalArgumentException("start needs a sequence name");
                }
                return new Request("start " + name, false) {
                    @Override
                    ControlResult call(BenchControl b) {
                        return b.startSequence(name);
                    }
                };
            }
            case "abort":
                return new Request("abort", false) {
                    @Override
                    ControlResult call(BenchControl b) {
                        return b.abort();
                    }
                };
            case "wind": {
                double w = number(m, "windMPerS", 0, 40);
                return new Request(String.format(Locale.ROOT, "wind %.2f m/s", w), true) {
                    @Override
                    ControlResult call(BenchControl b) {
                        return b.setWind(w);
                    }
                };
            }
            case "voltage": {
                double level = number(m, "levelPu", 0, 1.5);
                double dur = number(m, "durationS", 0, 60);
                if (level == 1.0) {
                    throw new IllegalArgumentException("levelPu 1 is no dip or swell");
                }
                if (dur <= 0) {
                    throw new IllegalArgumentException("durationS must be above 0");
                }
                String what = level < 1 ? "dip" : "swell";
                return new Request(String.format(Locale.ROOT, "%s to %.3f pu for %.3f s", what, level, dur), true) {
                    @Override
                    ControlResult call(BenchControl b) {
                        return b.voltageEvent(level, dur);
                    }
                };
            }
            case "vdevref": {
                double ref = number(m, "referencePu", -0.5, 0.5);
                return new Request(String.format(Locale.ROOT, "voltage-deviation reference %.3f pu", ref), true) {
                    @Override
                    ControlResult call(BenchControl b) {
                        return b.stepVoltageDeviationReference(ref);
                    }
                };
            }
            case "linkfault": {
                String fault = m.path("fault").asText("");
                double dur = number(m, "durationS", 0, 60);
                if (fault.isEmpty()) {
                    throw new IllegalArgumentException("linkfault needs a fault name");
                }
                if (dur <= 0) {
                    throw new IllegalArgumentException("durationS must be above 0");
                }
                return new Request(String.format(Locale.ROOT, "link fault %s for %.3f s", fault, dur), true) {
                    @Override
                    ControlResult call(BenchControl b) {
                        return b.injectLinkFault(fault, dur);
                    }
                };
            }
            default:
                throw new IllegalArgumentException("unknown action '" + action + "'");
        }
    }

    private static double number(JsonNode m, String field, double min, double max) {
        JsonNode n = m.get(field);
        if (n == null || !n.isNumber()) {
            throw new IllegalArgumentException(field + " must be a number");
        }
        double v = n.asDouble();
        if (!(v >= min && v <= max)) {
            throw new IllegalArgumentException(field + " " + v + " is outside " + min + " .. " + max);
        }
        return v;
    }

    @Override
    public void close() {
        controlThread.shutdown();
        try {
            controlThread.awaitTermination(2, TimeUnit.SECONDS);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
    }
}
