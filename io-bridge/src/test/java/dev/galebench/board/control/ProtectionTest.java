package dev.galebench.board.control;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.galebench.board.support.ClosedLoop;
import dev.galebench.plant.BoardCommand;
import dev.galebench.plant.SensorView;
import dev.galebench.plant.TurbineFile;
import dev.galebench.plant.TurbineParameters;
import org.junit.jupiter.api.Test;

/**
 * Protection relays and wind-speed states. Relay settings: controller defaults (IEEE 1547-2018
 * Table 11 pattern of two stages per direction; values our own); thresholds against the
 * turbine's hardware trips.
 */
class ProtectionTest {
    private static final TurbineParameters TURBINE = TurbineFile.defaults();

    @Test
    void shouldTripOnSustainedUndervoltageAfterItsDelayButNotBefore() {
        final ControllerSettings s = ControllerFile.defaults();
        final ClosedLoop cl = new ClosedLoop(TURBINE, s, 9.0);
        cl.plant.setGridVoltagePu(0.55, 0.55, 0.55); // terminal stays below 0.85 pu despite the support
        cl.run(s.undervoltageDelayS - 0.1);
        assertEquals(0, cl.controller.tripCause(), "still riding through before the delay");
        assertTrue(cl.controller.frtActive());
        cl.run(0.3);
        assertEquals(ReferenceController.CAUSE_UNDERVOLTAGE, cl.controller.tripCause());
        assertTrue((cl.command.boardStatus & BoardCommand.BOARD_TRIPPED) != 0);
        assertEquals(0, cl.command.commandFlags & (BoardCommand.CMD_GSC_ENABLE | BoardCommand.CMD_MSC_ENABLE),
                "converters blocked");
        assertEquals(0, cl.command.commandFlags & BoardCommand.CMD_BREAKER_CLOSE, "breaker opened");
    }

    @Test
    void shouldTripOnSustainedOvervoltageAfterItsDelayButNotBefore() {
        // a 1.2 pu swell held: the absorbed reactive current holds the terminal near 1.13 pu, above
        // the 1.10 pu stage (IEEE 1547-2018 Table 11 OV1: 1.10 pu, 2 s)
        final ControllerSettings s = ControllerFile.defaults();
        final ClosedLoop cl = new ClosedLoop(TURBINE, s, 9.0);
        cl.plant.setGridVoltagePu(1.2, 1.2, 1.2);
        cl.run(s.overvoltageDelayS - 0.2);
        assertEquals(0, cl.controller.tripCause(), "rides the swell before the delay");
        assertEquals(0, cl.plant.tripFlags());
        cl.run(0.4);
        assertEquals(ReferenceController.CAUSE_OVERVOLTAGE, cl.controller.tripCause());
        assertTrue((cl.command.boardStatus & BoardCommand.BOARD_TRIPPED) != 0);
    }

    @Test
    void shouldStopAboveCutOutAndRestartBelowItWithHysteresis() {
        final ControllerSettings s = ControllerFile.defaults();
        final ClosedLoop cl = new ClosedLoop(TURBINE, s, 20.0);
        cl.plant.setWindSpeed(TURBINE.cutOutWindMPerS + 3.0);
        cl.run(s.windFilterS + s.cutOutDelayS + 1.0);
        System.out.printf("cut-out: state %d, trip cause %d, plant trips %d, speed %.3f%n", cl.controller.state(),
                cl.controller.tripCause(), cl.plant.tripFlags(), cl.signal("rotor_speed_rad_s"));
        assertEquals(ReferenceController.STATE_STOPPED_HIGH_WIND, cl.controller.state());
        cl.run(30.0); // feathered and slowed down
        assertEquals(0, cl.command.commandFlags & BoardCommand.CMD_MSC_ENABLE, "machine side blocked");
        assertTrue((cl.command.commandFlags & BoardCommand.CMD_GSC_ENABLE) != 0, "grid side keeps the DC link");
        assertEquals(TURBINE.pitchMaxRad, cl.command.pitchRefRad, 1e-9, "feathering");
        assertEquals(0, cl.plant.tripFlags());
        // below cut-out but inside the hysteresis: stays stopped
        cl.plant.setWindSpeed(TURBINE.cutOutWindMPerS - 0.5 * s.restartHysteresisMPerS);
        cl.run(s.windFilterS * 3 + s.cutInDelayS + 1.0);
        assertEquals(ReferenceController.STATE_STOPPED_HIGH_WIND, cl.controller.state());
        // below the hysteresis: restarts
        cl.plant.setWindSpeed(TURBINE.cutOutWindMPerS - 2.0 * s.restartHysteresisMPerS);
        cl.run(s.windFilterS * 3 + s.cutInDelayS + 1.0);
        assertEquals(ReferenceController.STATE_RUNNING, cl.controller.state());
        assertTrue((cl.command.commandFlags & BoardCommand.CMD_MSC_ENABLE) != 0);
    }

    @Test
    void shouldStopBelowCutInAndRestartWhenTheWindReturns() {
        final ControllerSettings s = ControllerFile.defaults();
        final ClosedLoop cl = new ClosedLoop(TURBINE, s, 6.0);
        cl.plant.setWindSpeed(TURBINE.cutInWindMPerS - 1.0);
        cl.run(s.cutInDelayS - 1.0);
        assertEquals(ReferenceController.STATE_RUNNING, cl.controller.state(), "not before the delay");
        cl.run(s.windFilterS * 3 + 2.0);
        assertEquals(ReferenceController.STATE_STOPPED_LOW_WIND, cl.controller.state());
        assertTrue((cl.command.commandFlags & BoardCommand.CMD_GSC_ENABLE) != 0, "grid side keeps the DC link");
        assertEquals(0, cl.plant.tripFlags());
        cl.plant.setWindSpeed(6.0);
        cl.run(s.windFilterS * 3 + s.cutInDelayS + 1.0);
        assertEquals(ReferenceController.STATE_RUNNING, cl.controller.state());
        assertEquals(0, cl.controller.tripCause());
        assertEquals(1100, cl.signal("v_dc_v"), 11, "DC held throughout");
    }

    @Test
    void shouldTripOnDcOvervoltageAndOvercurrentFromTheMeasurement() {
        final ReferenceController ctl = new ReferenceController(TURBINE, ControllerFile.defaults());
        ctl.setSamplePeriod(50e-6);
        final SensorView in = new SensorView();
        final BoardCommand out = new BoardCommand();
        ReferenceControllerAllocationTest.fill(in, 0);
        ctl.start(in);
        for (int k = 0; k < 1000; k++) {
            ReferenceControllerAllocationTest.fill(in, k);
            in.dcLinkVoltageV = 0.99 * TURBINE.dcOvervoltageTripV; // above 0.97 of the hardware trip
            ctl.update(in, out);
        }
        assertTrue((ctl.tripCause() & ReferenceController.CAUSE_DC_OVERVOLTAGE) != 0);
        assertEquals(ReferenceController.STATE_TRIPPED, ctl.state());
        assertEquals(0.5, out.gscDutyA, 0.0);

        final ReferenceController ctl2 = new ReferenceController(TURBINE, ControllerFile.defaults());
        ctl2.setSamplePeriod(50e-6);
        ReferenceControllerAllocationTest.fill(in, 0);
        ctl2.start(in);
        ReferenceControllerAllocationTest.fill(in, 1);
        in.gridCurrentAA = 0.95 * TURBINE.gscCurrentTripA; // one sample over 0.9 of the trip: below the 2 ms delay
        ctl2.update(in, out);
        assertEquals(0, ctl2.tripCause());
        for (int k = 0; k < 60; k++) {
            in.gridCurrentAA = 0.95 * TURBINE.gscCurrentTripA;
            ctl2.update(in, out);
        }
        assertTrue((ctl2.tripCause() & ReferenceController.CAUSE_GSC_OVERCURRENT) != 0);
    }
}
