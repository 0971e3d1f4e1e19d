package dev.galebench.plant;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.galebench.plant.support.Scenario;
import dev.galebench.plant.support.SteadyDriver;
import java.lang.management.ManagementFactory;
import org.junit.jupiter.api.Test;

/** The real-time contract of {@link PlantModel}: no allocation per step, bit-for-bit determinism. */
class RealTimeContractTest {

    @Test
    void shouldAllocateNothingOverOneMillionSteps() {
        com.sun.management.ThreadMXBean mx = (com.sun.management.ThreadMXBean) ManagementFactory.getThreadMXBean();
        assertTrue(mx.isThreadAllocatedMemorySupported());
        mx.setThreadAllocatedMemoryEnabled(true);
        TurbineParameters p = TurbineFile.defaults();
        OperatingPoint op = SteadyState.solve(p, 9.0, 1.0, 0.0);
        TurbinePlant plant = new TurbinePlant(p, 50_000);
        plant.initialise(op);
        SteadyDriver driver = new SteadyDriver(plant, op);
        Scenario scenario = new Scenario(50_000);
        SensorView view = new SensorView();
        double[] sample = new double[plant.signalCount()];
        long tid = Thread.currentThread().getId();
        run(plant, driver, scenario, view, sample, 0, 200_000); // warm up, JIT
        // the fewest bytes of three windows of a million steps: a real allocation shows in every
        // window, a one-off charge of the JVM to this thread (a deoptimisation) in one only
        long fewest = Long.MAX_VALUE;
        for (int w = 0; w < 3; w++) {
            long from = 200_000 + w * 1_000_000L;
            long before = mx.getThreadAllocatedBytes(tid);
            run(plant, driver, scenario, view, sample, from, from + 1_000_000);
            fewest = Math.min(fewest, mx.getThreadAllocatedBytes(tid) - before);
        }
        assertEquals(0, fewest, "bytes allocated over 1,000,000 steps (step + sense + sample + inputs), fewest of 3 windows");
        assertEquals(3_200_000, plant.stepCount());
    }

    private static void run(TurbinePlant plant, SteadyDriver driver, Scenario scenario, SensorView view, double[] sample,
                            long from, long to) {
        for (long k = from; k < to; k++) {
            scenario.apply(k, plant);
            plant.step(driver.command());
            plant.sense(view);
            plant.sample(sample);
        }
    }

    @Test
    void shouldGiveIdenticalDoublesForIdenticalInputs() {
        TurbineParameters p = TurbineFile.defaults();
        OperatingPoint op = SteadyState.solve(p, 9.0, 1.0, 0.0);
        TurbinePlant a = new TurbinePlant(p, 20_000);
        TurbinePlant b = new TurbinePlant(p, 20_000);
        a.initialise(op);
        b.initialise(op);
        SteadyDriver da = new SteadyDriver(a, op);
        SteadyDriver db = new SteadyDriver(b, op);
        Scenario scenario = new Scenario(20_000);
        double[] sa = new double[a.signalCount()];
        double[] sb = new double[b.signalCount()];
        SensorView va = new SensorView();
        SensorView vb = new SensorView();
        double checksum = 0.0;
        for (long k = 0; k < 150_000; k++) {
            scenario.apply(k, a);
            scenario.apply(k, b);
            a.step(da.command());
            b.step(db.command());
            a.sample(sa);
            b.sample(sb);
            for (int i = 0; i < sa.length; i++) {
                if (Double.doubleToRawLongBits(sa[i]) != Double.doubleToRawLongBits(sb[i])) {
                    throw new AssertionError("step " + k + ": " + a.signalName(i) + " " + sa[i] + " != " + sb[i]);
                }
            }
            a.sense(va);
            b.sense(vb);
            assertEquals(Double.doubleToRawLongBits(va.gridCurrentAA), Double.doubleToRawLongBits(vb.gridCurrentAA));
            assertEquals(Double.doubleToRawLongBits(va.statorVoltageQV), Double.doubleToRawLongBits(vb.statorVoltageQV));
            checksum += sa[10];
        }
        // the scenario really moved the plant (a frozen plant would also be "deterministic")
        assertTrue(Double.isFinite(checksum));
        assertTrue(Math.abs(sa[TurbinePlant.S_W_ROTOR] - op.rotorSpeedRadPerS) > 1e-6, "the rotor must have moved");
    }
}
