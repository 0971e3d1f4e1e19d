package dev.galebench.rt;

import dev.galebench.rt.support.EchoBoardLink;
import dev.galebench.rt.support.FirstOrderTestPlant;
import dev.galebench.rt.support.LoopFixtures;
import org.HdrHistogram.EncodableHistogram;
import org.HdrHistogram.Histogram;
import org.HdrHistogram.HistogramLogReader;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

import static dev.galebench.rt.support.LoopFixtures.STEP_NS;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

class TimingLogTest {

    @Test
    void shouldWriteIntervalLogReadableByHistogramLogReader(@TempDir Path dir) throws Exception {
        FirstOrderTestPlant plant = new FirstOrderTestPlant(STEP_NS);
        LoopConfig cfg = LoopConfig.builder().stepPeriodNs(STEP_NS).durationSteps(6000).realTime(true)
                .timingIntervalNs(50_000_000).build();
        RealTimeLoop loop = new RealTimeLoop(cfg, plant, new EchoBoardLink(), null, List.of(), SampleLayout.of(plant));
        LoopResult r = loop.run();
        Path file = dir.resolve("timing.hlog");
        r.writeTimingLog(file);

        Map<String, Histogram> byTag = new HashMap<>();
        Map<String, Integer> intervals = new HashMap<>();
        try (HistogramLogReader reader = new HistogramLogReader(file.toFile())) {
            EncodableHistogram e;
            while ((e = reader.nextIntervalHistogram()) != null) {
                Histogram h = (Histogram) e;
                byTag.computeIfAbsent(h.getTag(), t -> new Histogram(3)).add(h);
                intervals.merge(h.getTag(), 1, Integer::sum);
            }
            assertEquals(r.latenessNs.getStartTimeStamp() / 1000.0, reader.getStartTimeSec(), 5.0);
        }
        assertEquals(6000, byTag.get("lateness").getTotalCount());
        assertEquals(6000, byTag.get("compute").getTotalCount());
        assertEquals(6000, byTag.get("rtt").getTotalCount());
        assertEquals(6000, byTag.get("reply_age").getTotalCount());
        assertEquals(r.latenessNs.getMaxValue(), byTag.get("lateness").getMaxValue());
        assertTrue(intervals.get("lateness") >= 3, "a 0.3 s run in 50 ms intervals: " + intervals);
        assertTrue(Files.readString(file).contains("#[StartTime: "));
    }

    @Test
    void shouldGiveLiveSnapshotsWhileRunning() throws Exception {
        FirstOrderTestPlant plant = new FirstOrderTestPlant(STEP_NS);
        LoopConfig cfg = LoopConfig.builder().stepPeriodNs(STEP_NS).durationSteps(10_000).realTime(true)
                .timingIntervalNs(20_000_000).build();
        RealTimeLoop loop = new RealTimeLoop(cfg, plant, new EchoBoardLink(), null, List.of(), SampleLayout.of(plant));
        final TimingSnapshot[] seen = new TimingSnapshot[1];
        Thread watcher = new Thread(() -> {
            try {
                TimingSnapshot s;
                do {
                    Thread.sleep(10);
                    s = loop.timings().snapshot();
                } while (s.intervalsClosed() < 3 && s.exchanges() < 10_000);
                seen[0] = s;
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
        });
        watcher.start();
        LoopResult r = loop.run();
        watcher.join();
        TimingSnapshot mid = seen[0];
        assertTrue(mid.exchanges() > 0 && mid.exchanges() <= r.exchanges);
        assertTrue(mid.lateness().count() > 0, "percentiles available while running");
        assertTrue(mid.lateness().count() <= mid.exchanges());
        TimingSnapshot end = loop.timings().snapshot();
        assertEquals(10_000, end.exchanges());
        assertEquals(10_000, end.lateness().count());
        assertEquals(STEP_NS, end.exchangePeriodNs());
        assertEquals(10_000, loop.timings().histogram("lateness").getTotalCount());
        assertEquals(10_000, loop.timings().histogram("rtt").getTotalCount());
        assertEquals(10_000, loop.linkCountersSnapshot().framesSent - 1);
        org.junit.jupiter.api.Assertions.assertThrows(IllegalArgumentException.class, () -> loop.timings().histogram("x"));
    }

    @Test
    void shouldMergeRunsMadeOneAfterTheOtherIntoOneResultAndOneLog(@TempDir Path dir) throws Exception {
        FirstOrderTestPlant plant = new FirstOrderTestPlant(STEP_NS);
        EchoBoardLink link = new EchoBoardLink(seq -> seq == 7 ? EchoBoardLink.DROP : EchoBoardLink.NORMAL);
        long base = System.currentTimeMillis();
        java.util.List<LoopResult> parts = new java.util.ArrayList<>();
        for (int round = 0; round < 3; round++) {
            link.counters().reset();
            LoopConfig cfg = LoopConfig.builder().stepPeriodNs(STEP_NS).durationSteps(2000).realTime(true).build();
            parts.add(new RealTimeLoop(cfg, plant, link, null, List.of(), SampleLayout.of(plant))
                    .timingLogBaseTimeMs(base).run());
        }
        LoopResult m = LoopResult.merge(parts);
        assertEquals(6000, m.exchanges);
        assertEquals(6000, m.latenessNs.getTotalCount());
        assertEquals(3, m.linkCounters.missingReplies, "frame 7 of each round was dropped");
        assertEquals(parts.get(0).overruns + parts.get(1).overruns + parts.get(2).overruns, m.overruns);
        Path file = dir.resolve("timing.hlog");
        m.writeTimingLog(file);
        long lateness = 0;
        try (HistogramLogReader reader = new HistogramLogReader(file.toFile())) {
            EncodableHistogram e;
            while ((e = reader.nextIntervalHistogram()) != null) {
                if ("lateness".equals(e.getTag())) {
                    lateness += ((Histogram) e).getTotalCount();
                }
            }
        }
        assertEquals(6000, lateness);
    }
}
