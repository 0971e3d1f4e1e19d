package dev.galebench.report;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.galebench.report.comtrade.ComtradeReader;
import dev.galebench.report.recording.ComtradeRecorder;
import dev.galebench.report.recording.ComtradeSettings;
import dev.galebench.report.recording.CsvRecorder;
import dev.galebench.report.recording.SignalRanges;
import dev.galebench.testsupport.ReportFixtures;
import dev.galebench.rt.LoopConfig;
import dev.galebench.rt.LoopResult;
import dev.galebench.rt.RealTimeLoop;
import dev.galebench.rt.SampleLayout;
import dev.galebench.rt.support.EchoBoardLink;
import dev.galebench.rt.support.FirstOrderTestPlant;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * A whole run folder made by the real loop (offline, rt-plant's first-order test plant and echo
 * board) with the streaming recorders on its rings, then the end-of-run reports from its
 * LoopResult: every exchange is in the COMTRADE file and the CSV, and the reports agree.
 */
class RunFolderWithRealLoopTest {
    @Test
    void shouldRecordEveryExchangeOfARealLoopRunAndReportIt(@TempDir Path dir) throws Exception {
        long steps = 40_000; // 2 s of plant time at 50 us
        FirstOrderTestPlant plant = new FirstOrderTestPlant(50_000L);
        LoopConfig cfg = LoopConfig.builder().stepPeriodNs(50_000L).exchangeEverySteps(1).durationSteps(steps)
                .realTime(false).offlineBackpressure(true).ringSize(1 << 14).build();
        ComtradeRecorder recording = new ComtradeRecorder(dir, "recording",
                ComtradeSettings.defaults("real_loop", 50.0, new SignalRanges(ReportFixtures.smallTurbine())));
        CsvRecorder csv = new CsvRecorder(dir.resolve("signals.csv"), List.of("x_v", "lateness_us"), 100);
        LoopResult result = new RealTimeLoop(cfg, plant, new EchoBoardLink(), null, List.of(recording, csv),
                SampleLayout.of(plant)).run();
        result.writeTimingLog(dir.resolve("timing.hlog"));

        assertEquals(steps, result.exchanges);
        assertEquals(0, result.totalSamplesMissed());
        assertEquals(result.exchanges, recording.recordCount());
        assertEquals(0, recording.gapCount());
        assertNull(recording.failure());
        ComtradeReader reader = ComtradeReader.open(recording.cfgPath());
        assertEquals(result.exchanges, reader.config().announcedRecordCount());
        assertTrue(reader.config().analogIndexOf("x_v") >= 0);
        assertTrue(reader.config().analogIndexOf("lateness_us") >= 0);
        assertTrue(reader.config().statusIndexOf("frt_active") >= 0);
        assertTrue(reader.config().statusIndexOf("board_running") >= 0);
        assertEquals(result.exchanges, reader.read((n, t, a, s) -> { }));
        assertEquals(1 + steps / 100, Files.readAllLines(dir.resolve("signals.csv")).size());

        RunReportInput in = RunReportInput.builder("first_order_offline").fromLoop(result).passed(true)
                .environment(RunEnvironment.capture()).comtradeBaseName("recording").csvFileName("signals.csv")
                .timingLogFileName("timing.hlog").plotSignals(List.of("x_v")).recording(RecordingStats.of(recording)).build();
        RunReports.writeAll(dir, in);
        JsonNode summary = new ObjectMapper().readTree(dir.resolve("summary.json").toFile());
        assertEquals("pass", summary.get("verdict").asText());
        assertEquals(steps, summary.get("exchanges").asLong());
        assertEquals(2.0, summary.get("plant_duration_s").asDouble(), 1e-9);
        assertEquals(steps, summary.get("timing").get("compute_us").get("count").asLong());
        assertEquals(0, summary.get("samples_dropped").asLong());
        assertEquals(steps, summary.get("recording").get("records").asLong());
        assertEquals(0, summary.get("recording").get("gaps").asLong());
        assertEquals("COMPLETED", summary.get("loop").get("stop").asText());
        assertEquals(steps, summary.get("loop").get("exchanges").asLong());
        String html = Files.readString(dir.resolve("report.html"));
        assertTrue(html.contains("<h1>first_order_offline</h1>"));
        assertTrue(html.contains("href=\"timing.hlog\""));
        assertTrue(html.contains("<th>loop stop</th><td class=\"mono\">COMPLETED</td>"), "loop summary in the environment panel");
        assertTrue(html.contains("x_v over") || html.contains("aria-label=\"x_v\""));
    }
}
