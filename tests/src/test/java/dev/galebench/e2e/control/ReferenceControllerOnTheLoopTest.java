package dev.galebench.e2e.control;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.galebench.board.ForwardingBoardController;
import dev.galebench.board.control.ControllerFile;
import dev.galebench.board.control.ReferenceController;
import dev.galebench.link.BoardLinks;
import dev.galebench.plant.BoardCommand;
import dev.galebench.plant.PlantModel;
import dev.galebench.plant.SensorView;
import dev.galebench.plant.SteadyState;
import dev.galebench.plant.TurbineFile;
import dev.galebench.plant.TurbineParameters;
import dev.galebench.plant.TurbinePlant;
import dev.galebench.rt.BoardLink;
import dev.galebench.rt.LoopConfig;
import dev.galebench.rt.LoopResult;
import dev.galebench.rt.RealTimeLoop;
import dev.galebench.rt.SampleLayout;
import java.util.List;
import org.junit.jupiter.api.Test;

/**
 * The reference controller on the project's own real-time loop in offline mode, through the
 * in-process link (real frame codec, FULL profile): the loop's order of exchange and step, the
 * wire's float32 values and its validation are all in the path. Scenario: 10 m/s, a dip to
 * 0.05 pu for 150 ms (EU RfG 2016/631 PPM type B/C profile: U_ret 0.05 pu, t_clear 0.15 s,
 * from memory), then 0.85 s of recovery.
 */
class ReferenceControllerOnTheLoopTest {
    /** Passes everything through and remembers what the board reported; adds nothing to the control. */
    private static final class Watching extends ForwardingBoardController {
        boolean frtSeen;
        int statusOr;
        double maxDcV;

        Watching(ReferenceController inner) {
            super(inner);
        }

        @Override
        public void update(SensorView in, BoardCommand out) {
            super.update(in, out);
            statusOr |= out.boardStatus;
            frtSeen |= (out.boardStatus & BoardCommand.BOARD_FRT_ACTIVE) != 0;
            maxDcV = Math.max(maxDcV, in.dcLinkVoltageV);
        }
    }

    @Test
    void shouldRideThroughADeepDipOnTheRealLoopThroughTheWireCodec() throws InterruptedException {
        final TurbineParameters p = TurbineFile.defaults();
        final long stepNs = 50_000;
        final TurbinePlant plant = new TurbinePlant(p, stepNs);
        plant.initialise(SteadyState.solve(p, 10.0, 1.0, 0.0));
        final Watching board = new Watching(new ReferenceController(p, ControllerFile.defaults()));
        board.setSamplePeriod(stepNs * 1e-9);
        final BoardLink link = BoardLinks.inProcess(board);
        final long dipStart = 4_000;  // 0.2 s
        final long dipEnd = 7_000;    // 0.35 s
        final long steps = 24_000;    // 1.2 s
        final double[] pGrid = new double[1];
        final double[] signals = new double[plant.signalCount()];
        int pIndex = -1;
        for (int i = 0; i < plant.signalCount(); i++) {
            if (plant.signalName(i).equals("p_grid_pu")) {
                pIndex = i;
            }
        }
        final int pGridIndex = pIndex;
        final LoopConfig cfg = LoopConfig.builder().stepPeriodNs(stepNs).exchangeEverySteps(1).durationSteps(steps)
                .realTime(false).ringSize(1024).build();
        final RealTimeLoop loop = new RealTimeLoop(cfg, plant, link, (long k, PlantModel m) -> {
            if (k == dipStart) {
                m.setGridVoltagePu(0.05, 0.05, 0.05);
            } else if (k == dipEnd) {
                m.setGridVoltagePu(1.0, 1.0, 1.0);
            } else if (k == steps - 1) {
                m.sample(signals);
                pGrid[0] = signals[pGridIndex];
            }
        }, List.of(), SampleLayout.of(plant));
        final double pBefore = SteadyState.solve(p, 10.0, 1.0, 0.0).gridPowerW / p.ratedPowerW;
        final LoopResult r = loop.run();
        System.out.printf("loop: %d exchanges, %d replies applied, DC max %.1f V, P at the end %.3f pu (before %.3f)%n",
                r.exchanges, r.repliesApplied, board.maxDcV, pGrid[0], pBefore);
        assertEquals(LoopResult.StopReason.COMPLETED, r.stopReason, r.stopDetail);
        assertEquals(0, r.tripFlags, "no plant trip");
        assertEquals(0, r.linkCounters.invalidReferences + r.linkCounters.crcErrors + r.linkCounters.malformedFrames);
        assertTrue(r.repliesApplied >= steps - 2);
        assertTrue(board.frtSeen, "the board reported FRT");
        assertEquals(0, board.statusOr & BoardCommand.BOARD_TRIPPED);
        assertTrue(board.maxDcV < p.dcOvervoltageTripV);
        assertEquals(pBefore, pGrid[0], 0.03, "active power recovered after the ramp");
    }
}
