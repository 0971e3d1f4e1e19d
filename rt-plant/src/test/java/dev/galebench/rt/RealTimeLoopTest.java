package dev.galebench.rt;

import dev.galebench.rt.support.CollectingConsumer;
import dev.galebench.rt.support.EchoBoardLink;
import dev.galebench.rt.support.FirstOrderTestPlant;
import dev.galebench.rt.support.LoopFixtures;
import org.junit.jupiter.api.Test;

import java.util.ArrayList;
import java.util.List;

import static dev.galebench.rt.support.LoopFixtures.STEP_NS;
import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

class RealTimeLoopTest {

    @Test
    void shouldExchangeOnceEveryStepWithM1() throws Exception {
        FirstOrderTestPlant plant = new FirstOrderTestPlant(STEP_NS);
        EchoBoardLink link = new EchoBoardLink();
        CollectingConsumer c = new CollectingConsumer();
        List<Long> hookSteps = new ArrayList<>();
        LoopResult r = LoopFixtures.run(LoopFixtures.offline(1, 1000).build(), plant, link,
                (step, p) -> hookSteps.add(step), List.of(c));
        assertEquals(1000, r.exchanges);
        assertEquals(1000, r.steps);
        assertEquals(1000, c.values.size());
        assertEquals(1001, link.counters().framesSent, "frame 0 before the first deadline, then one per exchange");
        assertEquals(1000, r.linkCounters.repliesAccepted);
        assertEquals(1000, r.repliesApplied);
        assertEquals(0, r.linkCounters.missingReplies);
        assertEquals(1000, hookSteps.size());
        for (int i = 0; i < 1000; i++) {
            assertEquals(i, hookSteps.get(i));
            assertEquals(i, c.indices.get(i)[0]);
            assertEquals(i + 1, c.indices.get(i)[1]);
            assertEquals((i + 1) * STEP_NS, c.indices.get(i)[2]);
        }
        assertEquals(LoopResult.StopReason.COMPLETED, r.stopReason);
        assertEquals(0, c.missedAtEnd);
    }

    @Test
    void shouldExchangeOnceEveryFourStepsWithM4() throws Exception {
        FirstOrderTestPlant plant = new FirstOrderTestPlant(STEP_NS);
        EchoBoardLink link = new EchoBoardLink();
        CollectingConsumer c = new CollectingConsumer();
        List<Long> hookSteps = new ArrayList<>();
        LoopResult r = LoopFixtures.run(LoopFixtures.offline(4, 1000).build(), plant, link,
                (step, p) -> hookSteps.add(step), List.of(c));
        assertEquals(250, r.exchanges);
        assertEquals(1000, r.steps);
        assertEquals(250, c.values.size());
        assertEquals(251, link.counters().framesSent);
        assertEquals(1000, hookSteps.size(), "the hook runs before every sub-step");
        for (int i = 0; i < 250; i++) {
            assertEquals(4L * (i + 1), c.indices.get(i)[1]);
        }
        assertEquals(1000 * STEP_NS, plant.plantTimeNs());
    }

    @Test
    void shouldRoundDurationUpToWholeExchanges() throws Exception {
        FirstOrderTestPlant plant = new FirstOrderTestPlant(STEP_NS);
        LoopResult r = LoopFixtures.run(LoopFixtures.offline(4, 10).build(), plant, new EchoBoardLink(), null, List.of());
        assertEquals(3, r.exchanges);
        assertEquals(12, r.steps);
    }

    @Test
    void shouldCountExchangesInRealTimeWithM1AndM4() throws Exception {
        for (int m : new int[] {1, 4}) {
            FirstOrderTestPlant plant = new FirstOrderTestPlant(STEP_NS);
            EchoBoardLink link = new EchoBoardLink();
            CollectingConsumer c = new CollectingConsumer();
            LoopConfig cfg = LoopConfig.builder().stepPeriodNs(STEP_NS).exchangeEverySteps(m).durationSteps(4000)
                    .realTime(true).build();
            LoopResult r = LoopFixtures.run(cfg, plant, link, null, List.of(c));
            assertEquals(4000 / m, r.exchanges, "M=" + m);
            assertEquals(4000, r.steps);
            assertEquals(4000 / m, r.latenessNs.getTotalCount());
            assertEquals(4000 / m, r.computeNs.getTotalCount());
            assertEquals(4000 / m, r.replyAgeExchanges.getTotalCount());
            assertEquals(4000 / m, c.values.size() + c.missedAtEnd);
            // the schedule is absolute: the run cannot end before its last deadline
            assertTrue(r.wallTimeNs >= (4000 / m - 1) * m * STEP_NS, "wall " + r.wallTimeNs);
        }
    }

    @Test
    void shouldProduceBitIdenticalSamplesOfflineWithSameInputs() throws Exception {
        double[][] first = runOfflineTrace();
        double[][] second = runOfflineTrace();
        assertEquals(first.length, second.length);
        for (int i = 0; i < first.length; i++) {
            assertArrayEquals(first[i], second[i], "exchange " + i);
        }
        // and the closed loop did something: x rose from 0 towards the board's 500 V target
        assertTrue(first[first.length - 1][0] > 400.0, "x at end " + first[first.length - 1][0]);
    }

    private static double[][] runOfflineTrace() throws Exception {
        FirstOrderTestPlant plant = new FirstOrderTestPlant(STEP_NS);
        EchoBoardLink link = new EchoBoardLink(seq -> seq % 97 == 0 ? EchoBoardLink.DELAY + 2 : EchoBoardLink.NORMAL);
        CollectingConsumer c = new CollectingConsumer();
        LoopResult r = LoopFixtures.run(LoopFixtures.offline(2, 20_000).build(), plant, link,
                (step, p) -> p.setWindSpeed(8.0 + (step % 1000) * 1e-3), List.of(c));
        assertEquals(0, r.totalSamplesMissed());
        SampleLayout layout = SampleLayout.of(plant);
        int timingFrom = layout.indexOf("lateness_us");
        double[][] out = new double[c.values.size()][];
        for (int i = 0; i < out.length; i++) {
            double[] v = c.values.get(i);
            double[] keep = new double[timingFrom + 1];
            System.arraycopy(v, 0, keep, 0, timingFrom);
            keep[timingFrom] = v[layout.indexOf("reply_age")];
            out[i] = keep;
        }
        return out;
    }

    @Test
    void shouldStopWhenAborted() throws Exception {
        FirstOrderTestPlant plant = new FirstOrderTestPlant(STEP_NS);
        LoopConfig cfg = LoopConfig.builder().stepPeriodNs(STEP_NS).realTime(true).build();
        RealTimeLoop loop = new RealTimeLoop(cfg, plant, new EchoBoardLink(), null, List.of(), SampleLayout.of(plant));
        Thread stopper = new Thread(() -> {
            while (loop.timings().snapshot().exchanges() < 200) {
                Thread.onSpinWait();
            }
            loop.abort("operator stop");
        });
        stopper.start();
        LoopResult r = loop.run();
        stopper.join();
        assertEquals(LoopResult.StopReason.ABORTED, r.stopReason);
        assertEquals("operator stop", r.stopDetail);
        assertTrue(r.aborted());
        assertTrue(r.exchanges >= 200);
        assertThrows(IllegalStateException.class, loop::run);
    }

    @Test
    void shouldStopOnPlantTripWhenAsked() throws Exception {
        FirstOrderTestPlant plant = new FirstOrderTestPlant(STEP_NS);
        plant.overvoltageTripV = 300.0;
        LoopResult r = LoopFixtures.run(LoopFixtures.offline(1, 100_000).stopOnTrip(true).build(), plant,
                new EchoBoardLink(), null, List.of());
        assertEquals(LoopResult.StopReason.PLANT_TRIP, r.stopReason);
        assertTrue(r.exchanges < 100_000);
        assertEquals(dev.galebench.plant.SensorView.TRIP_DC_OVERVOLTAGE, r.tripFlags);
        assertFalse(r.aborted());
    }

    @Test
    void shouldReportErrorThrownOnTheLoopThread() throws Exception {
        FirstOrderTestPlant plant = new FirstOrderTestPlant(STEP_NS);
        CollectingConsumer c = new CollectingConsumer();
        LoopResult r = LoopFixtures.run(LoopFixtures.offline(1, 1000).build(), plant, new EchoBoardLink(),
                (step, p) -> {
                    if (step == 500) {
                        throw new IllegalStateException("hook failed at 500");
                    }
                }, List.of(c));
        assertEquals(LoopResult.StopReason.ERROR, r.stopReason);
        assertTrue(r.stopDetail.contains("hook failed at 500"), r.stopDetail);
        assertEquals(500, r.exchanges);
        assertTrue(c.ended, "consumers are ended even after an error");
    }

    @Test
    void shouldRejectPlantWithOtherStep() {
        FirstOrderTestPlant plant = new FirstOrderTestPlant(20_000);
        LoopConfig cfg = LoopConfig.builder().stepPeriodNs(STEP_NS).build();
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> new RealTimeLoop(cfg, plant, new EchoBoardLink(), null, List.of(), SampleLayout.of(plant)));
        assertTrue(e.getMessage().contains("stepPeriodNs"), e.getMessage());
    }

    @Test
    void shouldSkipMissedDeadlinesAndCountThemUnderSkipPolicy() throws Exception {
        FirstOrderTestPlant plant = new FirstOrderTestPlant(STEP_NS);
        LoopConfig cfg = LoopConfig.builder().stepPeriodNs(STEP_NS).durationSteps(200).realTime(true)
                .missedTickPolicy(MissedTickPolicy.SKIP).build();
        // one 5 ms stall on the loop thread at step 100: about 100 deadlines pass
        LoopResult r = LoopFixtures.run(cfg, plant, new EchoBoardLink(), (step, p) -> {
            if (step == 100) {
                long until = System.nanoTime() + 5_000_000;
                while (System.nanoTime() < until) {
                    Thread.onSpinWait();
                }
            }
        }, List.of());
        assertEquals(200, r.exchanges, "every exchange still steps the plant");
        assertTrue(r.overruns >= 1, "overruns " + r.overruns);
        assertTrue(r.skippedExchanges >= 95, "skipped " + r.skippedExchanges);
        assertTrue(r.wallTimeNs >= (199 + r.skippedExchanges) * STEP_NS);
    }

    @Test
    void shouldCatchUpMissedDeadlinesAndCountOverrunsByDefault() throws Exception {
        FirstOrderTestPlant plant = new FirstOrderTestPlant(STEP_NS);
        LoopConfig cfg = LoopConfig.builder().stepPeriodNs(STEP_NS).durationSteps(400).realTime(true).build();
        LoopResult r = LoopFixtures.run(cfg, plant, new EchoBoardLink(), (step, p) -> {
            if (step == 100) {
                long until = System.nanoTime() + 5_000_000;
                while (System.nanoTime() < until) {
                    Thread.onSpinWait();
                }
            }
        }, List.of());
        assertEquals(0, r.skippedExchanges);
        // the exchanges after the stall start late by more than a period until caught up
        assertTrue(r.overruns >= 90, "overruns " + r.overruns);
        assertTrue(r.latenessNs.getMaxValue() >= 4_900_000, "max lateness " + r.latenessNs.getMaxValue());
    }

    @Test
    void shouldAbortLoopWhenCallerIsInterrupted() throws Exception {
        FirstOrderTestPlant plant = new FirstOrderTestPlant(STEP_NS);
        LoopConfig cfg = LoopConfig.builder().stepPeriodNs(STEP_NS).realTime(true).build();
        RealTimeLoop loop = new RealTimeLoop(cfg, plant, new EchoBoardLink(), null, List.of(), SampleLayout.of(plant));
        LoopResult[] result = new LoopResult[1];
        boolean[] flagAfter = new boolean[1];
        Thread caller = new Thread(() -> {
            try {
                result[0] = loop.run();
                flagAfter[0] = Thread.currentThread().isInterrupted();
            } catch (InterruptedException e) {
                throw new AssertionError(e);
            }
        });
        caller.start();
        while (loop.timings().snapshot().exchanges() < 100) {
            Thread.sleep(1);
        }
        caller.interrupt();
        caller.join(10_000);
        assertFalse(caller.isAlive());
        assertEquals(LoopResult.StopReason.ABORTED, result[0].stopReason);
        assertEquals("caller interrupted", result[0].stopDetail);
        assertTrue(flagAfter[0], "the interrupt is handed back to the caller");
    }

    @Test
    void shouldEndEveryRunWhenStoppedDuringATimingSwap() {
        // the timing reader flips recorders every 10 ms at the start of a run; HdrHistogram's flip
        // sleeps and swallows interrupts, so a reader stopped only by interrupt could hang run()
        org.junit.jupiter.api.Assertions.assertTimeoutPreemptively(java.time.Duration.ofSeconds(120), () -> {
            for (int i = 0; i < 200; i++) {
                FirstOrderTestPlant plant = new FirstOrderTestPlant(STEP_NS);
                // offline: the writer records flat out, so flips often wait for it (and sleep)
                LoopConfig cfg = LoopFixtures.offline(1, 20_000 + i).ringSize(2).offlineBackpressure(false).build();
                LoopResult r = LoopFixtures.run(cfg, plant, new EchoBoardLink(), null, List.of());
                assertEquals(20_000 + i, r.exchanges);
            }
        });
    }

    @Test
    void shouldPinLoopThreadToRequestedCpu() throws Exception {
        org.junit.jupiter.api.Assumptions.assumeTrue(java.nio.file.Files.isExecutable(java.nio.file.Path.of("/usr/bin/taskset")),
                "taskset (util-linux) is needed for pinning");
        FirstOrderTestPlant plant = new FirstOrderTestPlant(STEP_NS);
        String[] allowed = new String[1];
        LoopConfig cfg = LoopFixtures.offline(1, 10).pinCpu(0).build();
        LoopResult r = LoopFixtures.run(cfg, plant, new EchoBoardLink(), (step, p) -> {
            if (step == 0) { // test only: reads a file on the loop thread once
                try {
                    for (String line : java.nio.file.Files.readAllLines(java.nio.file.Path.of("/proc/thread-self/status"))) {
                        if (line.startsWith("Cpus_allowed_list:")) {
                            allowed[0] = line.substring(line.indexOf(':') + 1).trim();
                        }
                    }
                } catch (java.io.IOException e) {
                    throw new java.io.UncheckedIOException(e);
                }
            }
        }, List.of());
        assertTrue(r.pinning.startsWith("pinned to CPU 0"), r.pinning);
        assertEquals("0", allowed[0]);
    }
}
