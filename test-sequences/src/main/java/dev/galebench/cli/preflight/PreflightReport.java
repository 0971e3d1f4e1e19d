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
 * plus, among the extra keys, {@code "io_floor": {"lateness_us": P, "stalls", "ticks", "echoes"}}
 * when the I/O floor was measured, {@code "warmup_s"} and {@code "per_round"}.
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
    private double warmupS;
    private int exchangeEvery = 1;
    private String warmup = "none";
    private long[] roundStalls = new long[0];
    private long[] roundOverruns = new long[0];
    private double[] roundLoopMaxUs = new double[0];
    private SpinFloor.Result ioFloor;
    private long ioEchoes;
    private long[] roundIoStalls = new long[0];

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

    /** Records the exchange period in plant steps (default 1). */
    public PreflightReport exchangeEvery(int m) {
        this.exchangeEvery = m;
        return this;
    }

    /** Records the warm-up that ran before the measurement (seconds of real time, and a one-line description). */
    public PreflightReport warmup(double seconds, String description) {
        this.warmupS = seconds;
        this.warmup = description;
        return this;
    }

    /** Records what each round saw: the floor's stalls, the loop's overruns and worst lateness. */
    public PreflightReport perRound(java.util.List<SpinFloor.Result> floors, java.util.List<LoopResult> loops) {
        roundStalls = floors.stream().mapToLong(SpinFloor.Result::stalls).toArray();
        roundOverruns = loops.stream().mapToLong(r -> r.overruns).toArray();
        roundLoopMaxUs = loops.stream().mapToDouble(r -> r.latenessNs.getTotalCount() == 0 ? 0.0 : r.latenessNs.getMaxValue() / 1e3).toArray();
        return this;
    }

    /** Records the I/O floor (null: not measured), the echoes it received and its stalls per round. */
    public PreflightReport ioFloor(SpinFloor.Result io, long echoes, java.util.List<SpinFloor.Result> rounds) {
        this.ioFloor = io;
        this.ioEchoes = echoes;
        this.roundIoStalls = rounds.stream().mapToLong(SpinFloor.Result::stalls).toArray();
        return this;
    }

    /** The verdict: is the step sustainable on this machine. */
    public boolean sustainable() {
        return verdict.sustainable();
    }

    /** The plant step measured, us. */
    public long stepUs() {
        return stepUs;
    }

    /** The JSON document (pretty-printed). */
    public String json() {
        return write(jsonNode());
    }

    private static final ObjectMapper JSON = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);

    private static String write(ObjectNode n) {
        try {
            return JSON.writeValueAsString(n);
        } catch (com.fasterxml.jackson.core.JsonProcessingException e) {
            throw new IllegalStateException(e);
        }
    }

    /**
     * A sweep's JSON: {@code {"sweep": [one document per step, as {@link #json()}],
     * "smallest_sustainable_step_us": N or null}}.
     */
    public static String sweepJson(java.util.List<PreflightReport> reports) {
        ObjectNode root = JSON.createObjectNode();
        com.fasterxml.jackson.databind.node.ArrayNode a = root.putArray("sweep");
        for (PreflightReport r : reports) {
            a.add(r.jsonNode());
        }
        final long smallest = smallestSustainableStepUs(reports);
        if (smallest > 0) {
            root.put("smallest_sustainable_step_us", smallest);
        } else {
            root.putNull("smallest_sustainable_step_us");
        }
        return write(root);
    }

    /** The smallest step of {@code reports} whose verdict is sustainable, or -1 if none is. */
    public static long smallestSustainableStepUs(java.util.List<PreflightReport> reports) {
        return reports.stream().filter(PreflightReport::sustainable).mapToLong(PreflightReport::stepUs).min().orElse(-1);
    }

    /** A sweep's summary table, one line per step, and the smallest step that holds. */
    public static String sweepText(java.util.List<PreflightReport> reports) {
        StringBuilder sb = new StringBuilder("sweep summary (stalls and overruns: ticks late by more than one exchange)\n");
        sb.append(String.format(Locale.ROOT, "%8s %12s %14s %13s %12s %12s %10s  %s%n", "step us", "floor stalls",
                "i/o fl. stalls", "loop overruns", "floor p99.9", "loop p99.9", "missing %", "verdict"));
        for (PreflightReport r : reports) {
            sb.append(String.format(Locale.ROOT, "%8d %12d %14s %13d %12.2f %12.2f %10.2f  %s%n", r.stepUs,
                    r.floor.stalls(), r.ioFloor == null ? "-" : Long.toString(r.ioFloor.stalls()), r.loop.overruns,
                    pct(r.floor.latenessNs(), 99.9), pct(r.loop.latenessNs, 99.9),
                    100.0 * r.loop.linkCounters.missingReplies / Math.max(1, r.loop.exchanges),
                    r.sustainable() ? "sustainable" : "not sustainable"));
        }
        final long smallest = smallestSustainableStepUs(reports);
        sb.append(smallest > 0 ? "smallest step that holds: " + smallest + " us\n"
                : "none of these steps holds on this machine now\n");
        return sb.toString();
    }

    /** The JSON document as a tree. */
    ObjectNode jsonNode() {
        ObjectNode root = JSON.createObjectNode();
        root.put("step_us", stepUs);
        root.put("seconds", seconds);
        root.put("exchange_every", exchangeEvery);
        root.put("exchange_us", stepUs * exchangeEvery);
        root.put("rounds", rounds);
        root.put("warmup_s", warmupS);
        ObjectNode f = root.putObject("floor");
        putPercentiles(f.putObject("lateness_us"), floor.latenessNs());
        f.put("stalls", floor.stalls());
        f.put("ticks", floor.ticks());
        f.put("clock_gaps", floor.clockGaps());
        f.put("max_clock_gap_us", floor.maxClockGapNs() / 1e3);
        if (ioFloor != null) {
            ObjectNode io = root.putObject("io_floor");
            putPercentiles(io.putObject("lateness_us"), ioFloor.latenessNs());
            io.put("stalls", ioFloor.stalls());
            io.put("ticks", ioFloor.ticks());
            io.put("echoes", ioEchoes);
        }
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
        ObjectNode pr = root.putObject("per_round");
        pr.putPOJO("floor_stalls", roundStalls);
        if (ioFloor != null) {
            pr.putPOJO("io_floor_stalls", roundIoStalls);
        }
        pr.putPOJO("loop_overruns", roundOverruns);
        pr.putPOJO("loop_lateness_max_us", roundLoopMaxUs);
        root.put("board", board);
        root.put("pinning", loop.pinning);
        root.put("sustainable", verdict.sustainable());
        root.putPOJO("reasons", verdict.reasons());
        return root;
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
        sb.append(String.format(Locale.ROOT, "galebench preflight: step %d us%s, %.1f s of floor and %.1f s of loop, alternating in %d round(s)%n",
                stepUs, exchangeEvery == 1 ? "" : String.format(Locale.ROOT, ", exchange every %d steps (%d us)", exchangeEvery, stepUs * exchangeEvery),
                seconds, seconds, rounds));
        sb.append("board: ").append(board).append('\n');
        sb.append("pinning: ").append(loop.pinning);
        if ("not requested".equals(loop.pinning) && Runtime.getRuntime().availableProcessors() > 1) {
            sb.append(" (--pin-cpu N pins the loop and keeps the rest of this process off CPU N; see rt-plant/LOOP.md)");
        }
        sb.append('\n');
        sb.append("warm-up: ").append(warmup).append('\n');
        final boolean io = ioFloor != null;
        sb.append(String.format(Locale.ROOT, "%-22s %14s%s %14s %14s%n", "", "floor lateness",
                io ? String.format(Locale.ROOT, " %14s", "i/o floor") : "", "loop lateness", "loop rtt"));
        String[] names = {"p50", "p99", "p99.9", "p99.99", "max"};
        double[] ps = {50.0, 99.0, 99.9, 99.99, 100.0};
        for (int i = 0; i < names.length; i++) {
            sb.append(String.format(Locale.ROOT, "%-22s %14.2f%s %14.2f %14.2f%n", names[i] + " us",
                    pct(floor.latenessNs(), ps[i]), io ? String.format(Locale.ROOT, " %14.2f", pct(ioFloor.latenessNs(), ps[i])) : "",
                    pct(loop.latenessNs, ps[i]), pct(loop.roundTripNs, ps[i])));
        }
        sb.append(String.format(Locale.ROOT, "%-22s %14d%s %14d%n", "late > 1 step", floor.stalls(),
                io ? String.format(Locale.ROOT, " %14d", ioFloor.stalls()) : "", loop.overruns));
        sb.append(String.format(Locale.ROOT, "%-22s %14d%s %14d%n", "ticks / exchanges", floor.ticks(),
                io ? String.format(Locale.ROOT, " %14d", ioFloor.ticks()) : "", loop.exchanges));
        sb.append(String.format(Locale.ROOT, "%-22s %14d%n", "floor clock gaps", floor.clockGaps()));
        final String pad = io ? String.format(Locale.ROOT, " %14s", "") : "";
        sb.append(String.format(Locale.ROOT, "%-22s %14s%s %14.2f%n", "compute p99 us", "", pad, pct(loop.computeNs, 99.0)));
        sb.append(String.format(Locale.ROOT, "%-22s %14s%s %14d%n", "missing replies", "", pad, loop.linkCounters.missingReplies));
        if (roundStalls.length > 1) {
            sb.append(io ? "per round (floor stalls / i/o floor stalls / loop overruns / loop max us):"
                    : "per round (floor stalls / loop overruns / loop max us):");
            for (int i = 0; i < roundStalls.length; i++) {
                sb.append(io ? String.format(Locale.ROOT, " %d/%d/%d/%.0f", roundStalls[i], roundIoStalls[i], roundOverruns[i], roundLoopMaxUs[i])
                        : String.format(Locale.ROOT, " %d/%d/%.0f", roundStalls[i], roundOverruns[i], roundLoopMaxUs[i]));
            }
            sb.append('\n');
        }
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
