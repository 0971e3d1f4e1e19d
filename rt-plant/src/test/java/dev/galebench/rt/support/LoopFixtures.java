package dev.galebench.rt.support;

import dev.galebench.rt.BoardLink;
import dev.galebench.rt.LoopConfig;
import dev.galebench.rt.LoopResult;
import dev.galebench.rt.RealTimeLoop;
import dev.galebench.rt.SampleConsumer;
import dev.galebench.rt.SampleLayout;
import dev.galebench.rt.StepHook;

import java.util.List;

/** Shared helpers for loop tests. */
public final class LoopFixtures {
    public static final long STEP_NS = 50_000;

    private LoopFixtures() {
    }

    /** Offline config, exchange every {@code m} steps, {@code steps} long, a ring big enough for every sample. */
    public static LoopConfig.Builder offline(int m, long steps) {
        return LoopConfig.builder().stepPeriodNs(STEP_NS).exchangeEverySteps(m).durationSteps(steps)
                .realTime(false).ringSize(Math.max(2, Integer.highestOneBit((int) Math.min(1 << 22, steps)) * 2));
    }

    public static LoopResult run(LoopConfig cfg, FirstOrderTestPlant plant, BoardLink link, StepHook hook,
                                 List<SampleConsumer> consumers) throws InterruptedException {
        return new RealTimeLoop(cfg, plant, link, hook, consumers, SampleLayout.of(plant)).run();
    }
}
