package dev.galebench.e2e.loop;

import dev.galebench.board.ForwardingBoardController;
import dev.galebench.board.VirtualBoard;
import dev.galebench.board.control.ReferenceController;
import dev.galebench.link.BoardLinks;
import dev.galebench.link.LinkOptions;
import dev.galebench.plant.BoardCommand;
import dev.galebench.plant.SensorView;
import dev.galebench.plant.SteadyState;
import dev.galebench.plant.TurbineFile;
import dev.galebench.plant.TurbineParameters;
import dev.galebench.plant.TurbinePlant;
import dev.galebench.rt.BoardLink;
import dev.galebench.rt.LinkCounters;
import dev.galebench.rt.LoopConfig;
import dev.galebench.rt.LoopResult;
import dev.galebench.rt.RealTimeLoop;
import dev.galebench.rt.SampleLayout;
import dev.galebench.wire.WireProfile;
import org.junit.jupiter.api.Test;

import java.net.InetSocketAddress;
import java.util.List;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * Paced exchange ({@code LoopConfig.replyWaitNs > 0}) against a real UDP board whose controller
 * stalls for 3 ms every 400th frame: the stall is paid in plant-time pauses (counted overruns),
 * never in replies the plant steps past; strict real time with the same board misses replies.
 * Outcomes only, no latency numbers.
 */
class PacedExchangeTest {
    private static final long STEP_NS = 50_000;
    private static final int STALL_EVERY = 400;
    private static final long STALL_MS = 3;

    /** The reference controller with a deliberate 3 ms stall every {@code STALL_EVERY} frames (a board missing its deadline). */
    private static final class StallingController extends ForwardingBoardController {
        private long updates;

        StallingController() {
            super(ReferenceController.withDefaults());
        }

        @Override
        public void update(SensorView in, BoardCommand out) {
            if (++updates % STALL_EVERY == 0) {
                try {
                    Thread.sleep(STALL_MS);
                } catch (InterruptedException e) {
                    Thread.currentThread().interrupt();
                }
            }
            super.update(in, out);
        }
    }

    private static LoopResult run(long replyWaitNs) throws Exception {
        final TurbineParameters p = TurbineFile.defaults();
        final TurbinePlant plant = new TurbinePlant(p, STEP_NS);
        plant.initialise(SteadyState.solve(p, 10.0, 1.0, 0.0));
        try (VirtualBoard board = VirtualBoard.udp(new InetSocketAddress("127.0.0.1", 0), WireProfile.FULL,
                new StallingController(), STEP_NS * 1e-9)) {
            final Thread boardThread = new Thread(board::run, "paced-test-board");
            boardThread.setDaemon(true);
            boardThread.start();
            try (BoardLink link = BoardLinks.open("udp://127.0.0.1:" + board.udpPort(), LinkOptions.defaults())) {
                final LoopConfig cfg = LoopConfig.builder().stepPeriodNs(STEP_NS).exchangeEverySteps(1)
                        .durationSteps(4_000).realTime(true).watchdogNs(1_000_000_000L).ringSize(1024)
                        .replyWaitNs(replyWaitNs).build();
                return new RealTimeLoop(cfg, plant, link, null, List.of(), SampleLayout.of(plant)).run();
            }
        }
    }

    @Test
    void shouldPausePlantTimeInsteadOfSteppingPastALateBoard() throws Exception {
        final LoopResult r = run(200_000_000L);
        final LinkCounters c = r.linkCounters;
        assertEquals(LoopResult.StopReason.COMPLETED, r.stopReason, r.stopDetail);
        assertEquals(0, c.missingReplies, "no exchange stepped without the reply to its frame");
        assertEquals(r.exchanges, r.repliesApplied, "every exchange applied a fresh reply");
        assertTrue(r.overruns >= 4_000 / STALL_EVERY - 1, "the board's stalls show as overruns: " + r.overruns);
    }

    @Test
    void shouldMissRepliesWhenTheSameBoardStallsInStrictRealTime() throws Exception {
        final LoopResult r = run(0);
        assertEquals(LoopResult.StopReason.COMPLETED, r.stopReason, r.stopDetail);
        assertTrue(r.linkCounters.missingReplies >= 4_000 / STALL_EVERY * (STALL_MS * 1_000_000 / STEP_NS) / 2,
                "a 3 ms stall at 50 us leaves tens of exchanges without a reply: " + r.linkCounters.missingReplies);
    }
}
