package dev.galebench.cli.preflight;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ObjectNode;
import dev.galebench.rt.LoopResult;
import dev.galebench.rt.SpinFloor;
import org.HdrHistogram.Histogram;

import java.util.Locale;

/**
 * What {@code galebench preflight} prints: the floor and the loop side by side, as a text table
 * or as JSON of exactly this shape (extra keys allowed):
 * <pre>
 * {"step_us", "seconds",
 *  "floor": {"lateness_us": P, "stalls"},
 *  "loop":  {"lateness_us": P, "rtt_us": P, "overruns", "exchanges"}}
 * </pre>
 * with P = {"p50", "p99", "p999", "p9999", "max"} in microseconds.
 */
public final class PreflightReport {
    private final long stepUs;
    private final double seconds;
    private final int rounds;
    private final String board;
    private final SpinFloor.Result floor;
    private final LoopResult loop;
    private final PreflightVerdict verdict;

    public PreflightReport(long stepUs, double seconds, int rounds, String board, SpinFloor.Result floor,
                           LoopResult loop, PreflightVerdict verdict) {
        this.stepUs = stepUs;
        this.seconds = seconds;
        this.rounds = rounds;
        this.board = board;
        this.floor = floor;
        this.loop = loop;
        this.verdict = verdict;
    }

    /** The JSON document (pretty-printed). */
    public String json() {
        ObjectMapper om = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);
        ObjectNode root = om.createObjectNode();
        root.put("step_us", stepUs);
        root.put("seconds", seconds);
        root.put("rounds", rounds);
        ObjectNode f = root.putObject("floor");
        putPercentiles(f.putObject("lateness_us"), floor.latenessNs());
        f.put("stalls", floor.stalls());
        f.put("ticks", floor.ticks());
        f.put("clock_gaps", floor.clockGaps());
        f.put("max_clock_gap_us", floor.maxClockGapNs() / 1e3);
        ObjectNode l = root.putObject("loop");
        putPercentiles(l.putObject("lateness_us"), loop.latenessNs);
        putPercentiles(l.putObject("rtt_us"), loop.roundTripNs);
        putPercentiles(l.putObject("compute_us"), loop.computeNs);
        l.put("overruns", loop.overruns);
        l.put("exchanges", loop.exchanges);
        l.put("replies_applied", loop.repliesApplied);
        l.put("missing_replies", loop.linkCounters.missingReplies);
        l.put("late_replies", loop.linkCounters.lateReplies);
        l.put("watchdog_trips", loop.linkCounters.watchdogTrips);
        l.put("stop", loop.stopReason.name());
        l.put("trip_flags", loop.tripFlags);
        root.put("board", board);
        root.put("pinning", loop.pinning);
        root.put("sustainable", verdict.sustainable());
        root.putPOJO("reasons", verdict.reasons());
        try {
            return om.writeValueAsString(root);
        } catch (com.fasterxml.jackson.core.JsonProcessingException e) {
            throw new IllegalStateException(e);
        }
    }

    private static void putPercentiles(ObjectNode n, Histogram h) {
        n.put("p50", us(h, 50.0));
        n.put("p99", us(h, 99.0));
        n.put("p999", us(h, 99.9));
        n.put("p9999", us(h, 99.99));
        n.put("max", h.getTotalCount() == 0 ? 0.0 : h.getMaxValue() / 1e3);
    }

    private static double us(Histogram h, double percentile) {
        return h.getTotalCount() == 0 ? 0.0 : h.getValueAtPercentile(percentile) / 1e3;
    }

    /** The human-readable table. */
    public String text() {
        StringBuilder sb = new StringBuilder();
        sb.append(String.format(Locale.ROOT, "galebench preflight: step %d us, %.1f s of floor and %.1f s of loop, alternating in %d round(s)%n",
                stepUs, seconds, seconds, rounds));
        sb.append("board: ").append(board).append('\n');
        sb.append("pinning: ").append(loop.pinning).append('\n');
        sb.append(String.format(Locale.ROOT, "%-22s %14s %14s %14s%n", "", "floor lateness", "loop lateness", "loop rtt"));
        String[] names = {"p50", "p99", "p99.9", "p99.99", "max"};
        double[] ps = {50.0, 99.0, 99.9, 99.99, 100.0};
        for (int i = 0; i < names.length; i++) {
            sb.append(String.format(Locale.ROOT, "%-22s %14.2f %14.2f %14.2f%n", names[i] + " us",
                    pct(floor.latenessNs(), ps[i]), pct(loop.latenessNs, ps[i]), pct(loop.roundTripNs, ps[i])));
        }
        sb.append(String.format(Locale.ROOT, "%-22s %14d %14d%n", "late > 1 step", floor.stalls(), loop.overruns));
        sb.append(String.format(Locale.ROOT, "%-22s %14d %14d%n", "ticks / exchanges", floor.ticks(), loop.exchanges));
        sb.append(String.format(Locale.ROOT, "%-22s %14d%n", "floor clock gaps", floor.clockGaps()));
        sb.append(String.format(Locale.ROOT, "%-22s %14s %14.2f%n", "compute p99 us", "", pct(loop.computeNs, 99.0)));
        sb.append(String.format(Locale.ROOT, "%-22s %14s %14d%n", "missing replies", "", loop.linkCounters.missingReplies));
        sb.append("verdict: ").append(verdict.sustainable() ? "SUSTAINABLE" : "NOT SUSTAINABLE").append('\n');
        for (String r : verdict.reasons()) {
            sb.append("  - ").append(r).append('\n');
        }
        return sb.toString();
    }

    private static double pct(Histogram h, double p) {
        if (h.getTotalCount() == 0) {
            return 0.0;
        }
        return (p >= 100.0 ? h.getMaxValue() : h.getValueAtPercentile(p)) / 1e3;
    }
}
