package dev.galebench.rt;

import dev.galebench.rt.support.CollectingConsumer;
import dev.galebench.rt.support.EchoBoardLink;
import dev.galebench.rt.support.FirstOrderTestPlant;
import dev.galebench.rt.support.LoopFixtures;
import org.junit.jupiter.api.Test;

import java.util.List;

import static dev.galebench.rt.support.LoopFixtures.STEP_NS;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

class SlowConsumerTest {

    @Test
    void shouldCountSamplesASlowConsumerMissesWithoutBlockingTheLoop() throws Exception {
        final long exchanges = 10_000; // 0.5 s of real time
        FirstOrderTestPlant plant = new FirstOrderTestPlant(STEP_NS);
        CollectingConsumer slow = new CollectingConsumer(1); // 1 ms per sample: 10 s if the loop waited for it
        CollectingConsumer fast = new CollectingConsumer();
        LoopConfig cfg = LoopConfig.builder().stepPeriodNs(STEP_NS).durationSteps(exchanges).realTime(true)
                .ringSize(64).build();
        long t0 = System.nanoTime();
        LoopResult r = LoopFixtures.run(cfg, plant, new EchoBoardLink(), null, List.of(slow, fast));
        long elapsedNs = System.nanoTime() - t0;

        assertEquals(exchanges, r.exchanges);
        assertTrue(r.wallTimeNs < 5_000_000_000L, "the loop ran at its own pace, not the consumer's: " + r.wallTimeNs);
        assertTrue(r.samplesMissed[0] > exchanges / 2, "slow consumer missed " + r.samplesMissed[0]);
        assertEquals(exchanges, slow.values.size() + r.samplesMissed[0], "every sample delivered or counted");
        assertEquals(r.samplesMissed[0], slow.missedAtEnd, "the consumer is told what it missed");
        assertEquals(exchanges, fast.values.size() + r.samplesMissed[1]);
        assertTrue(r.samplesMissed[1] < r.samplesMissed[0], "a slow consumer costs the others nothing extra");
        // what the slow one did get is in order, without gaps being hidden
        long previous = -1;
        for (long[] idx : slow.indices) {
            assertTrue(idx[0] > previous);
            previous = idx[0];
        }
        assertTrue(elapsedNs < 20_000_000_000L);
    }

    @Test
    void shouldDropInsteadOfWaitingOfflineWithoutBackpressure() throws Exception {
        final long exchanges = 50_000;
        FirstOrderTestPlant plant = new FirstOrderTestPlant(STEP_NS);
        CollectingConsumer slow = new CollectingConsumer(1);
        LoopResult r = LoopFixtures.run(LoopFixtures.offline(1, exchanges).ringSize(16).offlineBackpressure(false).build(),
                plant, new EchoBoardLink(), null, List.of(slow));
        assertEquals(exchanges, r.exchanges);
        assertTrue(r.samplesMissed[0] > exchanges - 1000, "missed " + r.samplesMissed[0]);
        assertEquals(exchanges, slow.values.size() + r.samplesMissed[0]);
    }

    @Test
    void shouldDeliverEverySampleOfflineWithBackpressure() throws Exception {
        final long exchanges = 2_000;
        FirstOrderTestPlant plant = new FirstOrderTestPlant(STEP_NS);
        CollectingConsumer slowish = new CollectingConsumer();
        LoopResult r = LoopFixtures.run(LoopFixtures.offline(1, exchanges).ringSize(8).build(),
                plant, new EchoBoardLink(), null, List.of(slowish));
        assertEquals(0, r.samplesMissed[0]);
        assertEquals(exchanges, slowish.values.size());
    }

    @Test
    void shouldCountConsumerExceptionsAndKeepDelivering() throws Exception {
        FirstOrderTestPlant plant = new FirstOrderTestPlant(STEP_NS);
        SampleConsumer flaky = new SampleConsumer() {
            @Override
            public void onStart(String[] n, String[] u, long h, int m) {
            }

            @Override
            public void onSample(Sample s) {
                if (s.exchangeIndex % 100 == 0) {
                    throw new IllegalStateException("bad sample " + s.exchangeIndex);
                }
            }

            @Override
            public void onEnd(long missed) {
            }
        };
        CollectingConsumer other = new CollectingConsumer();
        LoopResult r = LoopFixtures.run(LoopFixtures.offline(1, 1000).build(), plant, new EchoBoardLink(), null,
                List.of(flaky, other));
        assertEquals(10, r.consumerErrors[0]);
        assertEquals(1000, other.values.size());
    }
}
