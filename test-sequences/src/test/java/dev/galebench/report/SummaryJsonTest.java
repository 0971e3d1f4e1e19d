package dev.galebench.report;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.galebench.testsupport.RunInputs;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

class SummaryJsonTest {
    static List<String> keys(JsonNode n) {
        List<String> k = new ArrayList<>();
        n.fieldNames().forEachRemaining(k::add);
        return k;
    }

    @Test
    void shouldWriteTheDocumentedKeysWithVerdictsAndPercentilesInMicroseconds(@TempDir Path dir) throws Exception {
        Path file = SummaryJson.write(dir, RunInputs.failing().build());
        JsonNode root = new ObjectMapper().readTree(file.toFile());
        // the schema of REPORTS.md, key by key and in order
        assertEquals(List.of("format", "format_version", "verdict", "sequence", "aborted_reason", "started_at",
                "plant_duration_s", "step_period_us", "exchange_every_steps", "exchanges", "checks_passed",
                "checks_failed", "checks", "timing", "samples_dropped", "link", "recording", "loop", "files", "environment"), keys(root));
        assertEquals("fail", root.get("verdict").asText());
        assertEquals(1, root.get("format_version").asInt());
        assertEquals(2, root.get("checks").size());
        JsonNode c0 = root.get("checks").get(0);
        assertEquals(List.of("name", "kind", "verdict", "measured", "required", "message", "signal", "window_start_s",
                "window_end_s", "band_low", "band_high"), keys(c0));
        assertEquals("pass", c0.get("verdict").asText());
        JsonNode c1 = root.get("checks").get(1);
        assertEquals("reactive_current_rise", c1.get("name").asText());
        assertEquals("fail", c1.get("verdict").asText());
        assertEquals("41.5 ms", c1.get("measured").asText());
        assertEquals("<= 30 ms", c1.get("required").asText());
        assertTrue(c1.get("band_high").isNull(), "NaN must be written as null");
        assertEquals(0.9, c1.get("band_low").asDouble());

        JsonNode timing = root.get("timing");
        assertEquals(List.of("lateness_us", "compute_us", "round_trip_us", "overruns"), keys(timing));
        // 1..1000 us evenly: the median is 500 us, p99 990 us (HdrHistogram, 3 significant digits)
        JsonNode late = timing.get("lateness_us");
        assertEquals(List.of("count", "min", "mean", "p50", "p90", "p99", "p99_9", "p99_99", "max"), keys(late));
        assertEquals(1000, late.get("count").asLong());
        assertEquals(500.0, late.get("p50").asDouble(), 0.5);
        assertEquals(990.0, late.get("p99").asDouble(), 1.0);
        assertEquals(1000.0, late.get("max").asDouble(), 1.0);
        assertEquals(1000.0, timing.get("round_trip_us").get("p50").asDouble(), 1.0);
        assertEquals(4, timing.get("overruns").asLong());
        assertEquals(0, root.get("samples_dropped").asLong());
        assertEquals(3, root.get("link").get("crc_errors").asLong());
        assertEquals("recording.cfg", root.get("files").get("comtrade_cfg").asText());
        assertEquals("timing.hlog", root.get("files").get("timing_log").asText());
        assertEquals("bench-7", root.get("environment").get("host").asText());
        assertTrue(root.get("recording").isNull());
    }

    @Test
    void shouldWriteNullTimingAndLinkForAnOfflineRunAndPassVerdict(@TempDir Path dir) throws Exception {
        RunReportInput in = RunReportInput.builder("offline").passed(true).checks(List.of(RunInputs.passedDcBand())).build();
        JsonNode root = new ObjectMapper().readTree(SummaryJson.write(dir, in).toFile());
        assertEquals("pass", root.get("verdict").asText());
        assertTrue(root.get("timing").get("round_trip_us").isNull());
        assertTrue(root.get("link").isNull());
        assertTrue(root.get("aborted_reason").isNull());
        assertEquals(0, root.get("timing").get("overruns").asLong());
    }

    @Test
    void shouldCountClampedAndMissingSamplesOfTheRecording(@TempDir Path dir) throws Exception {
        RecordingStats rs = new RecordingStats(1000, java.util.Map.of("i_grid_a_a", 12L), java.util.Map.of("rtt_us", 3L), 1, 0, 0, null);
        JsonNode root = new ObjectMapper().readTree(SummaryJson.write(dir, RunInputs.failing().recording(rs).build()).toFile());
        JsonNode rec = root.get("recording");
        assertEquals(List.of("records", "clamped_samples", "missing_samples", "gaps", "stamp_overflows", "unrecorded_samples",
                "failure"), keys(rec));
        assertEquals(12, rec.get("clamped_samples").get("i_grid_a_a").asLong());
        assertEquals(3, rec.get("missing_samples").get("rtt_us").asLong());
        assertEquals(1, rec.get("gaps").asLong());
        assertTrue(rec.get("failure").isNull());
    }
}
