package dev.galebench.rt;

import com.lmax.disruptor.SingleProducerSequencer;
import dev.galebench.rt.support.AllocationProbe;
import dev.galebench.rt.support.EchoBoardLink;
import dev.galebench.rt.support.FirstOrderTestPlant;
import dev.galebench.rt.support.LoopFixtures;
import org.junit.jupiter.api.Test;

import java.util.List;

import static dev.galebench.rt.support.LoopFixtures.STEP_NS;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;

/**
 * The loop thread allocates nothing once running: its allocated-bytes counter
 * ({@code com.sun.management.ThreadMXBean}) is read on the loop thread itself by the step hook
 * after a warm-up and again a million steps later, with supervision, sampling, two consumers'
 * rings and the link all in play.
 */
class AllocationFreeLoopTest {
    private static final long WARMUP_STEPS = 200_000;
    private static final long MEASURED_STEPS = 1_000_000;

    @Test
    void shouldAllocateNothingOnTheLoopThreadOverAMillionOfflineSteps() throws Exception {
        assertFalse(SingleProducerSequencer.class.desiredAssertionStatus(),
                "Disruptor assertions take a monitor on claim; the build turns them off");
        // three back-to-back measured windows: a one-off JVM charge shows in one, a real allocation in all
        AllocationProbe probe = new AllocationProbe(WARMUP_STEPS, MEASURED_STEPS, 3);
        final long total = probe.lastStep() + 10;
        FirstOrderTestPlant plant = new FirstOrderTestPlant(STEP_NS);
        // replies delayed now and then so the late/stale/missing paths run too; small rings so drops happen
        EchoBoardLink link = new EchoBoardLink(seq -> seq % 1000 == 0 ? EchoBoardLink.DELAY + 2
                : seq % 777 == 0 ? EchoBoardLink.NAN_DUTY : EchoBoardLink.NORMAL);
        LoopResult r = LoopFixtures.run(LoopFixtures.offline(1, total).ringSize(1024).offlineBackpressure(false).build(),
                plant, link, probe, List.of(new CountingConsumer(), new CountingConsumer()));
        assertEquals(total, r.steps);
        assertEquals(0, probe.fewestBytesInAWindow(),
                "bytes allocated by the loop thread over " + MEASURED_STEPS + " steps (fewest of 3 windows)");
    }

    @Test
    void shouldAllocateNothingOnTheLoopThreadOverAMillionRealTimeSteps() throws Exception {
        // a 2 us step makes a million real-time steps take about 2 s; most exchanges spin, some catch up.
        // The default 1 s timing interval falls inside the measured window: the recorders' phase flips
        // must not deoptimise the loop (see LoopTimings.takeInterval).
        final long stepNs = 2_000;
        // three back-to-back measured windows: a one-off JVM charge shows in one, a real allocation in all
        AllocationProbe probe = new AllocationProbe(WARMUP_STEPS, MEASURED_STEPS, 3);
        final long total = probe.lastStep() + 10;
        FirstOrderTestPlant plant = new FirstOrderTestPlant(stepNs);
        LoopConfig cfg = LoopConfig.builder().stepPeriodNs(stepNs).durationSteps(total).realTime(true)
                .watchdogNs(1_000_000_000L).ringSize(1024).build();
        LoopResult r = LoopFixtures.run(cfg, plant, new EchoBoardLink(), probe, List.of(new CountingConsumer()));
        assertEquals(total, r.steps);
        assertEquals(total, r.latenessNs.getTotalCount());
        assertEquals(0, probe.fewestBytesInAWindow(),
                "bytes allocated by the loop thread over " + MEASURED_STEPS + " real-time steps (fewest of 3 windows)");
    }

    /** Counts samples; allocation-free. */
    static final class CountingConsumer implements SampleConsumer {
        long count;

        @Override
        public void onStart(String[] signalNames, String[] signalUnits, long stepPeriodNs, int exchangeEverySteps) {
        }

        @Override
        public void onSample(Sample sample) {
            count++;
        }

        @Override
        public void onEnd(long samplesMissed) {
        }
    }
}
