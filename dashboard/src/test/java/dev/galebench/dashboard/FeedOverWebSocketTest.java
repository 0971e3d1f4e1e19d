package dev.galebench.dashboard;

import com.fasterxml.jackson.databind.JsonNode;
import dev.galebench.dashboard.support.ConsoleClient;
import dev.galebench.dashboard.support.SyntheticStream;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;

import java.util.ArrayList;
import java.util.List;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** The decimating feed and the hub over a real Netty server and real WebSocket clients. */
class FeedOverWebSocketTest {
    private static final long EXCHANGE_NS = 1_000_000L; // 1 ms: 20 exchanges per 20 ms bucket
    private Dashboard dashboard;

    @AfterEach
    void stop() {
        if (dashboard != null) {
            dashboard.close();
        }
    }

    private Dashboard start(TimingSource timing) {
        dashboard = Dashboard.start(DashboardOptions.loopback(0), null, timing);
        return dashboard;
    }

    @Test
    void shouldSendMinAndMaxOfEachBucketToEveryViewer() throws Exception {
        Dashboard d = start(null);
        try (ConsoleClient a = ConsoleClient.open(d.port(), ""); ConsoleClient b = ConsoleClient.open(d.port(), "")) {
            a.await("hello");
            b.await("hello");
            awaitViewers(d, 2);
            SyntheticStream s = new SyntheticStream(d.feed(), EXCHANGE_NS);
            s.start();
            s.run(60, (k, v) -> {
                v[0] = k == 37 ? 5000.0 : 1000.0 + (k % 20); // one single-exchange spike in bucket 1
                v[1] = k < 20 ? Double.NaN : 9.5;            // wind unknown for all of bucket 0
                v[2] = 3.0;
                v[3] = 40.0;
                v[4] = -1.0;
            });
            s.end(0);
            for (ConsoleClient c : List.of(a, b)) {
                JsonNode layout = c.await("layout");
                List<String> names = new ArrayList<>();
                layout.get("signals").forEach(n -> names.add(n.get("name").asText()));
                assertEquals(List.of("v_dc_v", "wind_m_s", "lateness_us", "rtt_us"), names, "plotted signals in option order, unplotted left out");
                assertEquals(0.02, layout.get("bucketS").asDouble(), 1e-12);
                JsonNode data = c.await("data");
                assertEquals(3, data.get("t").size());
                assertEquals(0.0, data.get("t").get(0).asDouble(), 1e-12);
                assertEquals(0.02, data.get("t").get(1).asDouble(), 1e-12);
                JsonNode vdcMin = data.get("min").get(0);
                JsonNode vdcMax = data.get("max").get(0);
                assertEquals(1000.0, vdcMin.get(0).asDouble());
                assertEquals(1019.0, vdcMax.get(0).asDouble());
                assertEquals(5000.0, vdcMax.get(1).asDouble(), "a one-exchange spike survives decimation");
                assertEquals(1000.0, vdcMin.get(1).asDouble());
                assertTrue(data.get("min").get(1).get(0).isNull(), "all-NaN bucket is sent as null");
                assertEquals(9.5, data.get("max").get(1).get(2).asDouble());
                c.await("streamEnd");
            }
        }
    }

    @Test
    void shouldResumeWithOnlyTheBatchesAReconnectingViewerMissed() throws Exception {
        Dashboard d = start(null);
        SyntheticStream s = new SyntheticStream(d.feed(), EXCHANGE_NS);
        SyntheticStream.Values ramp = (k, v) -> {
            v[0] = k;
            v[1] = 10;
            v[2] = 1;
            v[3] = 1;
            v[4] = 0;
        };
        String stream;
        long lastSeen;
        try (ConsoleClient a = ConsoleClient.open(d.port(), "")) {
            a.await("hello");
            awaitViewers(d, 1);
            s.start();
            stream = a.await("layout").get("stream").asText();
            for (int i = 0; i < 50 && d.lastBatch() < 2; i++) {
                s.runPaced(100, ramp);
            }
            lastSeen = a.await("data", m -> m.get("seq").asLong() >= 2, 5000).get("seq").asLong();
        }
        awaitViewers(d, 0);
        for (int i = 0; i < 50 && d.lastBatch() < lastSeen + 3; i++) {
            s.runPaced(100, ramp);
        }
        long newest = d.lastBatch();
        assertTrue(newest > lastSeen + 1, "batches were published while the viewer was away");

        try (ConsoleClient again = ConsoleClient.open(d.port(), "stream=" + stream + "&after=" + lastSeen)) {
            again.await("hello");
            JsonNode first = again.await("data");
            assertEquals(lastSeen + 1, first.get("seq").asLong(), "resumes right after the last batch it had");
            long expect = lastSeen + 2;
            while (expect <= newest) {
                assertEquals(expect, again.await("data").get("seq").asLong(), "no gap, no repeat");
                expect++;
            }
            assertTrue(again.seen().stream().noneMatch(m -> "layout".equals(m.path("type").asText())),
                    "a resuming viewer keeps its layout");
        }
        try (ConsoleClient fresh = ConsoleClient.open(d.port(), "")) {
            fresh.await("layout");
            assertEquals(1, fresh.await("data").get("seq").asLong(), "a new viewer gets the whole history");
        }
        s.end(0);
    }

    @Test
    void shouldReleaseViewersThatCloseOrVanish() throws Exception {
        Dashboard d = start(null);
        ConsoleClient polite = ConsoleClient.open(d.port(), "");
        ConsoleClient crashed = ConsoleClient.open(d.port(), "");
        polite.await("hello");
        crashed.await("hello");
        awaitViewers(d, 2);
        polite.close();
        crashed.abort();
        awaitViewers(d, 0);
        SyntheticStream s = new SyntheticStream(d.feed(), EXCHANGE_NS);
        s.start();
        s.run(2000, (k, v) -> v[0] = k);
        s.end(0);
        assertEquals(0, d.slowViewerSkips(), "nobody left to skip: closed tabs cost nothing");
        assertTrue(d.lastBatch() > 0);
    }

    @Test
    void shouldWidenBucketsWhenTheStreamRunsFasterThanRealTime() throws Exception {
        Dashboard d = start(null);
        try (ConsoleClient c = ConsoleClient.open(d.port(), "")) {
            c.await("hello");
            awaitViewers(d, 1);
            SyntheticStream s = new SyntheticStream(d.feed(), EXCHANGE_NS);
            s.start();
            // 80 s of plant time pushed in far less wall time
            s.run(80_000, (k, v) -> v[0] = k);
            s.end(0);
            c.await("streamEnd", m -> true, 10_000);
            List<Double> widths = new ArrayList<>();
            for (JsonNode m : c.seen()) {
                if ("data".equals(m.path("type").asText())) {
                    widths.add(m.get("bucketS").asDouble());
                }
            }
            double firstBucketS = widths.get(0);
            double lastBucketS = widths.get(widths.size() - 1);
            assertEquals(0.02, firstBucketS, 1e-12);
            assertTrue(lastBucketS >= 0.08, "bucket widened to keep the rate bounded, was " + lastBucketS);
            assertTrue(d.lastBatch() < 80_000 / 20 / DecimatingFeed.MAX_BATCH_BUCKETS,
                    "fewer batches than plain 20 ms buckets would need: " + d.lastBatch());
        }
    }

    @Test
    void shouldReportLatenessPercentilesHistogramAndBenchCounters() throws Exception {
        Dashboard d = start(into -> {
            into.exchanges = 1000;
            into.overruns = 3;
            into.linkPresent = true;
            into.link.framesSent = 1000;
            into.link.missingReplies = 2;
        });
        try (ConsoleClient c = ConsoleClient.open(d.port(), "")) {
            c.await("hello");
            awaitViewers(d, 1);
            SyntheticStream s = new SyntheticStream(d.feed(), EXCHANGE_NS);
            s.start();
            // lateness 0.5 us for 990 exchanges, 150 us for 10; round trip 40 us
            s.run(1000, (k, v) -> {
                v[2] = k % 100 == 99 ? 150.0 : 0.5;
                v[3] = 40.0;
            });
            s.end(7);
            JsonNode t = c.await("timing", m -> m.has("samplesMissed"), 5000);
            assertEquals(7, t.get("samplesMissed").asLong());
            assertEquals(1000, t.get("samples").asLong());
            JsonNode late = t.get("lateness");
            assertEquals(1000, late.get("count").asLong());
            assertEquals(0.5, late.get("p50Us").asDouble(), 0.01);
            assertEquals(150.0, late.get("maxUs").asDouble(), 150.0 * 0.01, "2 significant digits");
            long sum = 0;
            long above100 = 0;
            for (JsonNode bin : late.get("bins")) {
                sum += bin.get("count").asLong();
                if (bin.get("upToUs").asLong() == 200) {
                    above100 = bin.get("count").asLong();
                }
            }
            assertEquals(1000, sum, "every exchange lands in one bin");
            assertEquals(10, above100, "the ten 150 us ticks fall in the 100..200 us bin");
            assertEquals(40.0, t.get("roundTrip").get("p99Us").asDouble(), 0.4);
            assertEquals(3, t.get("overruns").asLong());
            assertEquals(2, t.get("link").get("missingReplies").asLong());
            assertFalse(t.has("timingSourceErrors"));
        }
    }

    @Test
    void shouldShowPendingChecksThenVerdictsThenTheReportAlsoToLateViewers() throws Exception {
        Dashboard d = start(null);
        java.nio.file.Path dir = java.nio.file.Files.createTempDirectory("galebench-run");
        try (ConsoleClient early = ConsoleClient.open(d.port(), "")) {
            early.await("hello");
            awaitViewers(d, 1);
            d.sequenceStarted("dip-3ph-deep", "run-1", List.of("iq-rise", "dc-band"));
            JsonNode running = early.await("run", m -> "running".equals(m.get("state").asText()), 5000);
            assertEquals("dip-3ph-deep", running.get("sequence").asText());
            assertEquals(2, running.get("checks").size());
            d.verdict(new Verdict("iq-rise", "rise_time", true, "18 ms", "<= 30 ms", "in time"), 1.03);
            d.verdict(new Verdict("dc-band", "band", false, "1402 V", "<= 1350 V", "left the band"), 2.5);
            d.sequenceFinished("dip-3ph-deep", "run-1", "failed", dir, null);
            assertEquals("iq-rise", early.await("verdict").get("name").asText());
            assertFalse(early.await("verdict").get("passed").asBoolean());
            JsonNode done = early.await("run", m -> "failed".equals(m.get("state").asText()), 5000);
            assertEquals("/runs/run-1/report.html", done.get("report").asText());
        }
        try (ConsoleClient late = ConsoleClient.open(d.port(), "")) {
            JsonNode run = late.await("run");
            assertEquals("failed", run.get("state").asText(), "a late viewer sees how the run ended");
            assertTrue(late.await("verdict", m -> "iq-rise".equals(m.get("name").asText()), 5000).get("passed").asBoolean());
            assertEquals(2.5, late.await("verdict", m -> "dc-band".equals(m.get("name").asText()), 5000).get("tS").asDouble());
        }
    }

    static void awaitViewers(Dashboard d, int n) throws InterruptedException {
        long deadline = System.nanoTime() + 5_000_000_000L;
        while (d.viewerCount() != n) {
            if (System.nanoTime() > deadline) {
                throw new AssertionError("expected " + n + " viewers, have " + d.viewerCount());
            }
            Thread.sleep(10);
        }
    }
}
