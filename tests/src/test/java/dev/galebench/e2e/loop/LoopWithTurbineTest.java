package dev.galebench.e2e.loop;

import dev.galebench.board.BoardControllers;
import dev.galebench.board.VirtualBoard;
import dev.galebench.link.BoardLinks;
import dev.galebench.link.LinkFaults;
import dev.galebench.link.LinkOptions;
import dev.galebench.plant.SensorView;
import dev.galebench.plant.SteadyState;
import dev.galebench.plant.TurbineFile;
import dev.galebench.plant.TurbineParameters;
import dev.galebench.plant.TurbinePlant;
import dev.galebench.rt.BoardLink;
import dev.galebench.rt.LoopConfig;
import dev.galebench.rt.LoopResult;
import dev.galebench.rt.RealTimeLoop;
import dev.galebench.rt.SampleConsumer;
import dev.galebench.rt.SampleLayout;
import dev.galebench.rt.support.AllocationProbe;
import dev.galebench.rt.support.CollectingConsumer;
import dev.galebench.wire.WireProfile;
import org.junit.jupiter.api.Test;

import java.net.InetAddress;
import java.net.InetSocketAddress;
import java.util.List;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * The real-time loop with the real turbine model and the real links: in-process (offline) and
 * UDP on loopback to the virtual board on its own thread (real time). Outcomes only: counts,
 * determinism, trips, allocation; never latency numbers.
 */
class LoopWithTurbineTest {
    private static final long STEP_NS = 50_000;
    private final TurbineParameters params = TurbineFile.defaults();

    private TurbinePlant settledPlant() {
        TurbinePlant plant = new TurbinePlant(params, STEP_NS);
        plant.initialise(SteadyState.solve(params, 0.8 * params.ratedWindMPerS, 1.0, 0.0));
        return plant;
    }

    private LoopConfig.Builder offline(long steps) {
        return LoopConfig.builder().stepPeriodNs(STEP_NS).durationSteps(steps).realTime(false)
                .pitchRefLimitsRad(params.pitchMinRad, params.pitchMaxRad).ringSize(1 << 15);
    }

    private double[][] offlineRun(long steps) throws Exception {
        TurbinePlant plant = settledPlant();
        CollectingConsumer c = new CollectingConsumer();
        try (BoardLink link = BoardLinks.inProcess(BoardControllers.create("hold"))) {
            LoopResult r = new RealTimeLoop(offline(steps).build(), plant, link, null, List.of(c),
                    SampleLayout.of(plant)).run();
            assertEquals(steps, r.exchanges);
            assertEquals(steps, r.repliesApplied);
            assertEquals(0, r.linkCounters.missingReplies);
            assertEquals(0, r.totalSamplesMissed());
        }
        int keep = SampleLayout.of(plant).indexOf("lateness_us");
        double[][] out = new double[c.values.size()][];
        for (int i = 0; i < out.length; i++) {
            out[i] = java.util.Arrays.copyOf(c.values.get(i), keep);
        }
        return out;
    }

    @Test
    void shouldRunTurbineOfflineWithInProcessBoardBitForBitTwice() throws Exception {
        double[][] a = offlineRun(10_000);
        double[][] b = offlineRun(10_000);
        assertEquals(10_000, a.length);
        for (int i = 0; i < a.length; i++) {
            assertArrayEquals(a[i], b[i], "exchange " + i);
        }
    }

    @Test
    void shouldAllocateNothingOnLoopThreadWithTurbineAndInProcessLink() throws Exception {
        final long warmup = 200_000;
        final long measured = 1_000_000;
        AllocationProbe probe = new AllocationProbe(warmup, measured, 3);
        TurbinePlant plant = settledPlant();
        try (BoardLink link = BoardLinks.inProcess(BoardControllers.create("hold"))) {
            // a consumer that keeps nothing: 3.2 million kept samples would not fit the test heap
            SampleConsumer counting = new SampleConsumer() {
                @Override
                public void onStart(String[] signalNames, String[] signalUnits, long stepPeriodNs, int exchangeEverySteps) {
                }

                @Override
                public void onSample(dev.galebench.rt.Sample sample) {
                }

                @Override
                public void onEnd(long samplesMissed) {
                }
            };
            LoopResult r = new RealTimeLoop(offline(probe.lastStep() + 10).ringSize(1024).offlineBackpressure(false)
                    .build(), plant, link, probe, List.of(counting), SampleLayout.of(plant)).run();
            assertEquals(probe.lastStep() + 10, r.steps);
        }
        assertEquals(0, probe.fewestBytesInAWindow(),
                "bytes allocated by the loop thread over " + measured + " turbine steps (fewest of 3 windows)");
    }

    @Test
    void shouldTripWatchdogAndBlockConvertersWhenInProcessBoardFallsSilent() throws Exception {
        LinkFaults faults = new LinkFaults();
        TurbinePlant plant = settledPlant();
        CollectingConsumer c = new CollectingConsumer();
        // the board falls silent from step 1000 on (a sequence action would do the same)
        try (BoardLink link = BoardLinks.inProcess(BoardControllers.create("hold"), LinkOptions.defaults().faults(faults))) {
            LoopResult r = new RealTimeLoop(offline(3000).build(), plant, link,
                    (step, p) -> faults.silent = step >= 1000, List.of(c), SampleLayout.of(plant)).run();
            assertEquals(1, r.linkCounters.watchdogTrips);
            assertEquals(SensorView.TRIP_LINK_WATCHDOG, r.tripFlags & SensorView.TRIP_LINK_WATCHDOG);
            // the reply to frame 1000 was polled at exchange 1000, before the hook silenced the link
            assertEquals(1999, r.linkCounters.missingReplies);
        }
        int status = c.column("status_flags");
        int trips = c.column("trip_flags");
        // 20 ms = 400 exchanges after the last valid reply, applied at exchange 1000
        assertEquals(0, (int) c.values.get(1399)[trips] & SensorView.TRIP_LINK_WATCHDOG);
        assertEquals(SensorView.TRIP_LINK_WATCHDOG, (int) c.values.get(1400)[trips] & SensorView.TRIP_LINK_WATCHDOG);
        double[] after = c.values.get(2999);
        assertEquals(SensorView.TRIP_LINK_WATCHDOG, (int) after[trips] & SensorView.TRIP_LINK_WATCHDOG);
        int blocked = SensorView.STATUS_MSC_BLOCKED | SensorView.STATUS_GSC_BLOCKED;
        assertEquals(blocked, (int) after[status] & blocked);
        assertEquals(0.5, after[c.column("gsc_duty_a")]);
        assertEquals(0.0, after[c.column("chopper_duty")]);
    }

    @Test
    void shouldExchangeWithVirtualBoardOverUdpLoopbackInRealTime() throws Exception {
        TurbinePlant plant = settledPlant();
        VirtualBoard board = VirtualBoard.udp(new InetSocketAddress(InetAddress.getLoopbackAddress(), 0),
                WireProfile.FULL, BoardControllers.create("hold"), STEP_NS * 1e-9);
        Thread boardThread = new Thread(board::run, "test-board");
        boardThread.start();
        CollectingConsumer c = new CollectingConsumer();
        try (BoardLink link = BoardLinks.open("udp://127.0.0.1:" + board.udpPort(), LinkOptions.defaults())) {
            LoopConfig cfg = LoopConfig.builder().stepPeriodNs(STEP_NS).durationSteps(10_000).realTime(true)
                    .pitchRefLimitsRad(params.pitchMinRad, params.pitchMaxRad).build();
            LoopResult r = new RealTimeLoop(cfg, plant, link, null, List.of(c), SampleLayout.of(plant)).run();
            assertEquals(10_000, r.exchanges);
            assertEquals(10_001, r.linkCounters.framesSent);
            assertEquals(0, r.linkCounters.crcErrors + r.linkCounters.malformedFrames + r.linkCounters.invalidReferences);
            assertTrue(r.repliesApplied > 0, "the board answered: " + r.summary());
            assertTrue(r.roundTripNs.getTotalCount() > 0 && r.roundTripNs.getTotalCount() <= r.repliesApplied,
                    "a round trip per applied reply within the send-time window");
            assertTrue(r.roundTripNs.getMinNonZeroValue() > 0);
            // each exchange checks the frame sent before it: answered in time, or counted missing
            // (how many of each depends on the machine's load; the sum does not)
            assertEquals(r.exchanges, r.linkCounters.missingReplies + r.repliesApplied - r.linkCounters.lateReplies,
                    r.summary().toString());
            assertEquals(10_000, c.values.size() + r.samplesMissed[0]);
        } finally {
            board.close();
            boardThread.join(2000);
        }
    }
}
