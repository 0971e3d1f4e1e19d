package dev.galebench.plant;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.galebench.plant.support.SteadyDriver;
import org.junit.jupiter.api.Test;

/** Hardware protection, gate blocking, breaker and input guards. */
class ProtectionTest {
    private final TurbineParameters p = TurbineFile.defaults();

    private TurbinePlant settled(double wind) {
        TurbinePlant plant = new TurbinePlant(p, 50_000);
        plant.initialise(SteadyState.solve(p, wind, 1.0, 0.0));
        return plant;
    }

    @Test
    void shouldBlockBothConvertersOnGridSideOvercurrent() {
        OperatingPoint op = SteadyState.solve(p, 14.0, 1.0, 0.0);
        TurbinePlant plant = settled(14.0);
        SteadyDriver driver = new SteadyDriver(plant, op);
        plant.setGridVoltagePu(0.2, 0.2, 0.2); // fixed converter voltage against a deep dip: about 2 pu more current
        int steps = 0;
        while (plant.tripFlags() == 0 && steps < 2000) {
            plant.step(driver.command());
            steps++;
        }
        assertEquals(SensorView.TRIP_GSC_OVERCURRENT, plant.tripFlags() & SensorView.TRIP_GSC_OVERCURRENT);
        assertTrue(steps < 400, "trips within 20 ms, took " + steps + " steps");
        plant.step(driver.command());
        double[] s = new double[plant.signalCount()];
        plant.sample(s);
        assertEquals(0.0, s[TurbinePlant.S_IG_A], 0.0);
        assertEquals(0.0, s[TurbinePlant.S_IS_Q], 0.0);
        SensorView v = new SensorView();
        plant.sense(v);
        int blocked = SensorView.STATUS_GSC_BLOCKED | SensorView.STATUS_MSC_BLOCKED;
        assertEquals(blocked, v.statusFlags & blocked);
        assertTrue((v.statusFlags & SensorView.TRIP_GSC_OVERCURRENT) != 0);
        // with the gates blocked and the breaker closed the terminal sees the source (0.2 pu)
        plant.step(driver.command());
        plant.sample(s);
        assertEquals(0.2, Math.hypot(s[TurbinePlant.S_VT_D], s[TurbinePlant.S_VT_Q]) / PerUnitBase.gridSide(p).voltagePeakV, 1e-9);
    }

    @Test
    void shouldTripOnDcOvervoltageWhenTheGridSideStops() {
        OperatingPoint op = SteadyState.solve(p, 14.0, 1.0, 0.0);
        TurbinePlant plant = settled(14.0);
        SteadyDriver driver = new SteadyDriver(plant, op);
        int steps = 0;
        while (plant.tripFlags() == 0 && steps < 2000) {
            BoardCommand c = driver.command();
            c.commandFlags &= ~BoardCommand.CMD_GSC_ENABLE;
            plant.step(c);
            steps++;
        }
        assertEquals(SensorView.TRIP_DC_OVERVOLTAGE, plant.tripFlags());
        // 0.033 F from 1100 V to 1350 V at about 3.9 MW takes about 2.5 ms
        double expectedS = 0.5 * p.dcCapacitanceF * (p.dcOvervoltageTripV * p.dcOvervoltageTripV
                - p.dcVoltageNominalV * p.dcVoltageNominalV) / op.statorPowerW;
        assertEquals(expectedS, steps * 50e-6, 0.25 * expectedS);
    }

    @Test
    void shouldDischargeTheDcLinkThroughTheChopper() {
        TurbinePlant plant = settled(2.0);
        BoardCommand c = new BoardCommand();
        c.block(true);
        c.chopperDuty = 0.5;
        double v0 = plant.dcLinkVoltageV();
        plant.step(c);
        double[] s = new double[plant.signalCount()];
        plant.sample(s);
        double v1 = s[TurbinePlant.S_VDC];
        assertEquals(0.5 * v1 * v1 / p.chopperResistanceOhm, s[TurbinePlant.S_P_CHOP], 1e-9 * s[TurbinePlant.S_P_CHOP]);
        // RC discharge with the duty-averaged resistance R/d: v1 = v0 exp(-h d / (R C))
        assertEquals(v0 * Math.exp(-50e-6 * 0.5 / (p.chopperResistanceOhm * p.dcCapacitanceF)), v1, 1e-9 * v0);
        SensorView v = new SensorView();
        plant.sense(v);
        assertTrue((v.statusFlags & SensorView.STATUS_CHOPPER_ON) != 0);
    }

    @Test
    void shouldTripOnOverspeedAndFeatherTheBlades() {
        TurbinePlant plant = settled(14.0);
        BoardCommand c = new BoardCommand();
        c.block(true); // no generator torque: the rotor runs away
        c.pitchRefRad = plant.x[TurbinePlant.PITCH];
        int steps = 0;
        while (plant.tripFlags() == 0 && steps < 200_000) {
            plant.step(c);
            steps++;
        }
        assertEquals(SensorView.TRIP_OVERSPEED, plant.tripFlags());
        double pitchAtTrip = plant.x[TurbinePlant.PITCH];
        for (int i = 0; i < 20_000; i++) { // 1 s
            plant.step(c);
        }
        assertEquals(Math.min(p.pitchMaxRad, pitchAtTrip + p.pitchRateMaxRadPerS * 1.0), plant.x[TurbinePlant.PITCH], 0.02,
                "feathering at the rate limit despite the board's pitch reference");
    }

    @Test
    void shouldKeepTripsLatchedUntilAResetEdge() {
        TurbinePlant plant = settled(9.0);
        OperatingPoint op = SteadyState.solve(p, 9.0, 1.0, 0.0);
        SteadyDriver driver = new SteadyDriver(plant, op);
        plant.forceTrip(SensorView.TRIP_LINK_WATCHDOG);
        for (int i = 0; i < 10; i++) {
            plant.step(driver.command());
        }
        assertEquals(SensorView.TRIP_LINK_WATCHDOG, plant.tripFlags());
        BoardCommand c = driver.command();
        c.commandFlags |= BoardCommand.CMD_TRIP_RESET;
        plant.step(c);
        assertEquals(0, plant.tripFlags());
        plant.forceTrip(SensorView.TRIP_LINK_WATCHDOG);
        plant.step(c); // reset still high: no new edge, trip stays
        assertEquals(SensorView.TRIP_LINK_WATCHDOG, plant.tripFlags());
    }

    @Test
    void shouldCarryNoGridCurrentWithTheBreakerOpen() {
        OperatingPoint op = SteadyState.solve(p, 9.0, 1.0, 0.0);
        TurbinePlant plant = settled(9.0);
        SteadyDriver driver = new SteadyDriver(plant, op);
        BoardCommand c = driver.command();
        c.commandFlags &= ~BoardCommand.CMD_BREAKER_CLOSE;
        plant.step(c);
        double[] s = new double[plant.signalCount()];
        plant.sample(s);
        assertEquals(0.0, s[TurbinePlant.S_P_GRID], 0.0);
        // the terminal sees the converter's own voltage
        assertEquals(Math.hypot(op.converterVoltageDV, op.converterVoltageQV), Math.hypot(s[TurbinePlant.S_VT_D], s[TurbinePlant.S_VT_Q]),
                2e-3 * op.dcLinkVoltageV);
        SensorView v = new SensorView();
        plant.sense(v);
        assertEquals(0, v.statusFlags & SensorView.STATUS_BREAKER_CLOSED);
    }

    @Test
    void shouldIgnoreNonFiniteInputs() {
        TurbinePlant plant = settled(9.0);
        BoardCommand c = new BoardCommand();
        c.mscDutyA = Double.NaN;
        c.gscDutyB = Double.POSITIVE_INFINITY;
        c.chopperDuty = Double.NaN;
        c.pitchRefRad = Double.NaN;
        c.commandFlags = BoardCommand.CMD_MSC_ENABLE | BoardCommand.CMD_GSC_ENABLE | BoardCommand.CMD_BREAKER_CLOSE;
        plant.setWindSpeed(Double.NaN);
        plant.setGridFrequencyHz(Double.NaN);
        plant.setGridVoltagePu(Double.NaN, 1, 1);
        for (int i = 0; i < 100; i++) {
            plant.step(c);
        }
        double[] s = new double[plant.signalCount()];
        plant.sample(s);
        for (int i = 0; i < s.length; i++) {
            assertTrue(Double.isFinite(s[i]), plant.signalName(i));
        }
        assertEquals(9.0, s[TurbinePlant.S_WIND], 0.0);
        assertEquals(50.0, s[TurbinePlant.S_FREQ], 0.0);
    }
}
