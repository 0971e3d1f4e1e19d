package dev.galebench.rt;

import com.lmax.disruptor.SingleProducerSequencer;
import dev.galebench.plant.PlantModel;
import dev.galebench.rt.support.EchoBoardLink;
import dev.galebench.rt.support.FirstOrderTestPlant;
import dev.galebench.rt.support.LoopFixtures;
import org.junit.jupiter.api.Test;

import java.lang.management.ManagementFactory;
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

    /** Reads the current thread's allocated bytes at two steps; allocation-free itself. */
    static final class AllocationProbe implements StepHook {
        private final com.sun.management.ThreadMXBean mx =
                (com.sun.management.ThreadMXBean) ManagementFactory.getThreadMXBean();
        final long[] readings = new long[2];
        private final long firstStep;
        private final long secondStep;

        AllocationProbe(long firstStep, long secondStep) {
            this.firstStep = firstStep;
            this.secondStep = secondStep;
            mx.getCurrentThreadAllocatedBytes();
        }

        @Override
        public void beforeStep(long stepIndex, PlantModel plant) {
            if (stepIndex == firstStep) {
                readings[0] = mx.getCurrentThreadAllocatedBytes();
            } else if (stepIndex == secondStep) {
                readings[1] = mx.getCurrentThreadAllocatedBytes();
            }
        }
    }

    @Test
    void shouldAllocateNothingOnTheLoopThreadOverAMillionOfflineSteps() throws Exception {
        assertFalse(SingleProducerSequencer.class.desiredAssertionStatus(),
                "Disruptor assertions take a monitor on claim; the build turns them off");
        final long total = WARMUP_STEPS + MEASURED_STEPS + 10;
        AllocationProbe probe = new AllocationProbe(WARMUP_STEPS, WARMUP_STEPS + MEASURED_STEPS);
        FirstOrderTestPlant plant = new FirstOrderTestPlant(STEP_NS);
        // replies delayed now and then so the late/stale/missing paths run too; small rings so drops happen
        EchoBoardLink link = new EchoBoardLink(seq -> seq % 1000 == 0 ? EchoBoardLink.DELAY + 2
                : seq % 777 == 0 ? EchoBoardLink.NAN_DUTY : EchoBoardLink.NORMAL);
        LoopResult r = LoopFixtures.run(LoopFixtures.offline(1, total).ringSize(1024).offlineBackpressure(false).build(),
                plant, link, probe, List.of(new CountingConsumer(), new CountingConsumer()));
        assertEquals(total, r.steps);
        assertEquals(0, probe.readings[1] - probe.readings[0],
                "bytes allocated by the loop thread over " + MEASURED_STEPS + " steps");
    }

    @Test
    void shouldAllocateNothingOnTheLoopThreadOverAMillionRealTimeSteps() throws Exception {
        // a 2 us step makes a million real-time steps take about 2 s; most exchanges spin, some catch up.
        // Timing intervals every 10 ms, so the warm-up also covers the first interval swaps: the first
        // swap after C2 compiled the recording path takes an uncommon trap once (a never-seen min/max
        // branch of the fresh interval histogram); deoptimising re-materialises scalar-replaced objects
        // (a few hundred bytes, once). Steady state is what this test asserts.
        final long stepNs = 2_000;
        final long total = WARMUP_STEPS + MEASURED_STEPS + 10;
        AllocationProbe probe = new AllocationProbe(WARMUP_STEPS, WARMUP_STEPS + MEASURED_STEPS);
        FirstOrderTestPlant plant = new FirstOrderTestPlant(stepNs);
        LoopConfig cfg = LoopConfig.builder().stepPeriodNs(stepNs).durationSteps(total).realTime(true)
                .watchdogNs(1_000_000_000L).ringSize(1024).timingIntervalNs(10_000_000).build();
        LoopResult r = LoopFixtures.run(cfg, plant, new EchoBoardLink(), probe, List.of(new CountingConsumer()));
        assertEquals(total, r.steps);
        assertEquals(total, r.latenessNs.getTotalCount());
        assertEquals(0, probe.readings[1] - probe.readings[0],
                "bytes allocated by the loop thread over " + MEASURED_STEPS + " real-time steps");
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
