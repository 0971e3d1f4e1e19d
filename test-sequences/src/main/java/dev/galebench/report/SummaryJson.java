package dev.galebench.report;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import dev.galebench.rt.LinkCounters;
import org.HdrHistogram.Histogram;

import java.io.IOException;
import java.nio.file.Path;
import java.util.Map;

/**
 * Writes {@code summary.json}: the verdicts and key figures of one run, for scripts and CI
 * dashboards. The schema (key names, units, types) is documented in
 * {@code test-sequences/REPORTS.md} and versioned by {@code format_version}; keys are only ever
 * added within a version. Unset numbers (a check with no window, a run with no board) are JSON
 * {@code null}, never NaN.
 */
public final class SummaryJson {
    /** Written as {@code format_version}; bump when a key changes meaning or disappears. */
    public static final int FORMAT_VERSION = 1;
    /** Percentiles written for every timing histogram, with their JSON key names. */
    static final double[] PERCENTILES = {50.0, 90.0, 99.0, 99.9, 99.99};
    static final String[] PERCENTILE_KEYS = {"p50", "p90", "p99", "p99_9", "p99_99"};

    private static final ObjectMapper MAPPER = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);

    private SummaryJson() {
    }

    /** Writes {@code runDir/summary.json}. */
    public static Path write(Path runDir, RunReportInput in) throws IOException {
        Path file = runDir.resolve(RunReports.SUMMARY_JSON);
        MAPPER.writeValue(file.toFile(), toTree(in));
        return file;
    }

    /** The summary as a JSON tree (keys in schema order). */
    public static ObjectNode toTree(RunReportInput in) {
        ObjectNode root = MAPPER.createObjectNode();
        root.put("format", "galebench-run-summary");
        root.put("format_version", FORMAT_VERSION);
        root.put("verdict", in.verdict());
        ObjectNode seq = root.putObject("sequence");
        seq.put("name", in.sequenceName());
        seq.put("file", in.sequenceFile());
        seq.put("description", in.description());
        root.put("aborted_reason", in.abortedReason());
        root.put("started_at", in.startedAt().toString());
        root.put("plant_duration_s", in.plantDurationS());
        root.put("step_period_us", in.stepPeriodNs() / 1000.0);
        root.put("exchange_every_steps", in.exchangeEverySteps());
        root.put("exchanges", in.exchanges());
        root.put("checks_passed", in.checks().size() - in.failedCheckCount());
        root.put("checks_failed", in.failedCheckCount());
        ArrayNode checks = root.putArray("checks");
        for (CheckOutcome c : in.checks()) {
            ObjectNode o = checks.addObject();
            o.put("name", c.name());
            o.put("kind", c.kind());
            o.put("verdict", c.passed() ? "pass" : "fail");
            o.put("measured", c.measured());
            o.put("required", c.required());
            o.put("message", c.message());
            o.put("signal", c.signal());
            putNumberOrNull(o, "window_start_s", c.windowStartS());
            putNumberOrNull(o, "window_end_s", c.windowEndS());
            putNumberOrNull(o, "band_low", c.bandLow());
            putNumberOrNull(o, "band_high", c.bandHigh());
        }
        ObjectNode timing = root.putObject("timing");
        putHistogram(timing, "lateness_us", in.latenessNs());
        putHistogram(timing, "compute_us", in.computeNs());
        putHistogram(timing, "round_trip_us", in.roundTripNs());
        timing.put("overruns", in.overruns());
        root.put("samples_dropped", in.samplesDropped());
        LinkCounters l = in.link();
        if (l == null) {
            root.putNull("link");
        } else {
            ObjectNode link = root.putObject("link");
            link.put("frames_sent", l.framesSent);
            link.put("replies_accepted", l.repliesAccepted);
            link.put("crc_errors", l.crcErrors);
            link.put("malformed_frames", l.malformedFrames);
            link.put("late_replies", l.lateReplies);
            link.put("stale_replies", l.staleReplies);
            link.put("duplicate_replies", l.duplicateReplies);
            link.put("missing_replies", l.missingReplies);
            link.put("invalid_references", l.invalidReferences);
            link.put("send_failures", l.sendFailures);
            link.put("watchdog_trips", l.watchdogTrips);
        }
        RecordingStats rs = in.recording();
        if (rs == null) {
            root.putNull("recording");
        } else {
            ObjectNode rec = root.putObject("recording");
            rec.put("records", rs.records());
            ObjectNode clamped = rec.putObject("clamped_samples");
            rs.clampedSamples().forEach(clamped::put);
            ObjectNode missing = rec.putObject("missing_samples");
            rs.missingSamples().forEach(missing::put);
            rec.put("gaps", rs.gaps());
            rec.put("stamp_overflows", rs.stampOverflows());
            rec.put("unrecorded_samples", rs.unrecordedSamples());
            rec.put("failure", rs.failure());
        }
        if (in.loopSummary() == null) {
            root.putNull("loop");
        } else {
            root.set("loop", MAPPER.valueToTree(in.loopSummary()));
        }
        ObjectNode files = root.putObject("files");
        files.put("report_html", RunReports.REPORT_HTML);
        files.put("junit_xml", RunReports.JUNIT_XML);
        files.put("comtrade_cfg", in.comtradeBaseName() == null ? null : in.comtradeBaseName() + ".cfg");
        files.put("comtrade_dat", in.comtradeBaseName() == null ? null : in.comtradeBaseName() + ".dat");
        files.put("csv", in.csvFileName());
        files.put("timing_log", in.timingLogFileName());
        ObjectNode env = root.putObject("environment");
        for (Map.Entry<String, String> e : in.environment().entrySet()) {
            env.put(e.getKey(), e.getValue());
        }
        return root;
    }

    private static void putNumberOrNull(ObjectNode o, String key, double v) {
        if (Double.isFinite(v)) {
            o.put(key, v);
        } else {
            o.putNull(key);
        }
    }

    /** Histogram in ns written as microseconds with 3 decimals (ns resolution); null if absent or empty. */
    private static void putHistogram(ObjectNode parent, String key, Histogram h) {
        if (h == null || h.getTotalCount() == 0) {
            parent.putNull(key);
            return;
        }
        ObjectNode o = parent.putObject(key);
        o.put("count", h.getTotalCount());
        o.put("min", micros(h.getMinValue()));
        o.put("mean", Math.round(h.getMean()) / 1000.0);
        for (int i = 0; i < PERCENTILES.length; i++) {
            o.put(PERCENTILE_KEYS[i], micros(h.getValueAtPercentile(PERCENTILES[i])));
        }
        o.put("max", micros(h.getMaxValue()));
    }

    static double micros(long ns) {
        return ns / 1000.0;
    }
}
