package dev.galebench.board.control;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.galebench.board.support.ControlFixtures;
import dev.galebench.plant.BoardCommand;
import dev.galebench.plant.SensorView;
import dev.galebench.board.BoardController;
import org.junit.jupiter.api.Test;

class ReferenceControllerAllocationTest {
    @Test
    void shouldAllocateNothingOverAMillionUpdates() {
        final ReferenceController ctl = new ReferenceController(ControlFixtures.turbine(), ControllerFile.defaults());
        ctl.setSamplePeriod(50e-6);
        final SensorView in = new SensorView();
        final BoardCommand out = new BoardCommand();
        fill(in, 0);
        ctl.start(in);
        // warm-up and measurement run the same method, so the measured code is the compiled one
        double sink = updates(ctl, in, out, 1_000_000);
        final double[] sinks = new double[1];
        final long bytes = dev.galebench.support.Allocations.minOverWindows(3,
                () -> sinks[0] += updates(ctl, in, out, 1_000_000));
        assertTrue(sink > 0 && sinks[0] > 0);
        assertEquals(0L, bytes, "bytes allocated by 1,000,000 updates (fewest of 3 windows)");
    }

    private static double updates(BoardController ctl, SensorView in, BoardCommand out, int count) {
        double sink = 0;
        for (int k = 0; k < count; k++) {
            fill(in, k);
            ctl.update(in, out);
            sink += out.gscDutyA;
        }
        return sink;
    }

    /** A rotating, slightly varying measurement set (a dip every 0.5 s so the FRT path runs too). */
    static void fill(SensorView in, int k) {
        final double t = k * 50e-6;
        final double th = 2 * Math.PI * 50 * t;
        final double u = ((k / 10_000) % 2 == 1) ? 0.5 : 1.0;
        final double v = u * Math.sqrt(2.0 / 3.0) * 690;
        in.gridVoltageAV = v * Math.cos(th);
        in.gridVoltageBV = v * Math.cos(th - 2 * Math.PI / 3);
        in.gridVoltageCV = v * Math.cos(th + 2 * Math.PI / 3);
        in.gridCurrentAA = 3000 * Math.cos(th);
        in.gridCurrentBA = 3000 * Math.cos(th - 2 * Math.PI / 3);
        in.gridCurrentCA = 3000 * Math.cos(th + 2 * Math.PI / 3);
        final double the = 60 * 1.5 * t;
        in.statorCurrentAA = 4000 * Math.cos(the + 1.6);
        in.statorCurrentBA = 4000 * Math.cos(the + 1.6 - 2 * Math.PI / 3);
        in.statorCurrentCA = 4000 * Math.cos(the + 1.6 + 2 * Math.PI / 3);
        in.rotorAngleRad = Transforms.wrap(1.5 * t);
        in.rotorSpeedRadPerS = 1.5;
        in.dcLinkVoltageV = 1100 + 10 * Math.sin(t);
        in.windSpeedMPerS = 10;
        in.pitchAngleRad = 0;
        in.plantTimeNs = k * 50_000L;
    }
}
