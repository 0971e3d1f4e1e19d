package dev.galebench.dashboard;

import com.fasterxml.jackson.databind.JsonNode;
import dev.galebench.dashboard.support.ConsoleClient;
import dev.galebench.rt.LoopConfig;
import dev.galebench.rt.LoopResult;
import dev.galebench.rt.RealTimeLoop;
import dev.galebench.rt.SampleLayout;
import dev.galebench.rt.support.EchoBoardLink;
import dev.galebench.rt.support.FirstOrderTestPlant;
import org.junit.jupiter.api.Test;

import java.util.ArrayList;
import java.util.List;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** The console as a consumer of the real real-time loop, watched over a real socket. */
class RealLoopFeedTest {
    private static final long STEP_NS = 50_000;

    @Test
    void shouldShowARealTimeLoopWithItsOwnTimingAndLinkCounters() throws Exception {
        DashboardOptions o = new DashboardOptions("127.0.0.1", 0, null, false,
                List.of("x_v", "duty_1", "lateness_us", "rtt_us"), DashboardOptions.DEFAULT_BUCKET_NS);
        FirstOrderTestPlant plant = new FirstOrderTestPlant(STEP_NS);
        EchoBoardLink link = new EchoBoardLink();
        LoopConfig cfg = LoopConfig.builder().stepPeriodNs(STEP_NS).durationSteps(20_000).realTime(true).build(); // 1 s
        try (Dashboard d = Dashboard.start(o, null, null);
             ConsoleClient viewer = ConsoleClient.open(d.port(), "")) {
            viewer.await("hello");
            RealTimeLoop loop = new RealTimeLoop(cfg, plant, link, null, List.of(d.feed()), SampleLayout.of(plant));
            d.timingSource(TimingSource.of(loop, link));
            LoopResult r = loop.run();

            JsonNode layout = viewer.await("layout");
            List<String> names = new ArrayList<>();
            layout.get("signals").forEach(s -> names.add(s.get("name").asText()));
            assertEquals(List.of("x_v", "duty_1", "lateness_us", "rtt_us"), names);
            assertEquals(STEP_NS * 1e-9, layout.get("exchangePeriodS").asDouble(), 1e-15);

            JsonNode end = viewer.await("streamEnd", m -> true, 15_000);
            assertEquals(r.samplesMissed[0], end.get("samplesMissed").asLong(), "the console reports what the ring says it missed");
            JsonNode timing = viewer.await("timing", m -> m.has("samplesMissed"), 5_000);
            assertEquals(r.exchanges - r.samplesMissed[0], timing.get("lateness").get("count").asLong(),
                    "every delivered exchange's lateness is in the histogram");
            assertEquals(r.exchanges, timing.get("exchanges").asLong());
            assertEquals(r.overruns, timing.get("overruns").asLong());
            assertEquals(link.counters().framesSent, timing.get("link").get("framesSent").asLong());
            assertTrue(timing.get("link").get("repliesAccepted").asLong() > 0);

            double lastT = -1;
            double xMax = Double.NEGATIVE_INFINITY;
            for (JsonNode m : viewer.seen()) {
                if ("data".equals(m.path("type").asText())) {
                    JsonNode t = m.get("t");
                    lastT = t.get(t.size() - 1).asDouble();
                    for (JsonNode v : m.get("max").get(0)) {
                        xMax = Math.max(xMax, v.asDouble());
                    }
                }
            }
            assertTrue(lastT > 0.9, "plots reach the end of the 1 s run, last bucket at " + lastT);
            assertEquals(EchoBoardLink.TARGET_V, xMax, 50.0, "the plant's voltage, regulated by the echo board, is drawn");
        }
    }
}
