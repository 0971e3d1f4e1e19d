package dev.galebench.support;

import dev.galebench.board.BoardController;
import dev.galebench.plant.BoardCommand;
import dev.galebench.plant.SensorView;

/** Small real controllers for link tests (each implements the whole contract). */
public final class TestControllers {
    private TestControllers() {
    }

    /**
     * Duties derived from the measurement (so a test can check the reply answers this very
     * frame): MSC duty a = 0.5 + grid voltage a / 2000 V, others fixed; NaN in the GSC duty
     * a when {@link #writeNan} is set; duty 1.5 when {@link #writeOutOfRange} is set.
     */
    public static final class Echoing implements BoardController {
        public volatile boolean writeNan;
        public volatile boolean writeOutOfRange;
        public volatile int starts;
        public volatile double samplePeriodS;

        @Override
        public void setSamplePeriod(double samplePeriodS) {
            this.samplePeriodS = samplePeriodS;
        }

        @Override
        public void start(SensorView first) {
            starts++;
        }

        @Override
        public void update(SensorView in, BoardCommand out) {
            out.mscDutyA = 0.5 + in.gridVoltageAV / 2000.0;
            out.mscDutyB = 0.25;
            out.mscDutyC = 0.75;
            out.gscDutyA = writeNan ? Double.NaN : 0.5;
            out.gscDutyB = writeOutOfRange ? 1.5 : 0.5;
            out.gscDutyC = 0.5;
            out.chopperDuty = 0.0;
            out.pitchRefRad = 0.1;
            out.commandFlags = BoardCommand.CMD_BREAKER_CLOSE | BoardCommand.CMD_GSC_ENABLE;
            out.boardStatus = BoardCommand.BOARD_RUNNING | BoardCommand.BOARD_PLL_LOCKED;
        }
    }
}
