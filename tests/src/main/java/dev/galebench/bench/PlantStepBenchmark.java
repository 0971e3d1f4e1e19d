package dev.galebench.bench;

import dev.galebench.plant.BoardCommand;
import dev.galebench.plant.OperatingPoint;
import dev.galebench.plant.SensorView;
import dev.galebench.plant.SteadyState;
import dev.galebench.plant.TurbineFile;
import dev.galebench.plant.TurbineParameters;
import dev.galebench.plant.TurbinePlant;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Level;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.TearDown;
import org.openjdk.jmh.annotations.Warmup;

/**
 * One plant step of the full default turbine (two-mass drivetrain, both converters running,
 * 9 m/s, MPPT), as the real-time thread takes it. The duties are recomputed for every step
 * the way a board would (open-loop dq voltages at the true angles): {@link #commandOnly} is
 * that cost alone, as a baseline in the same run; {@link #step} is command + plant step;
 * {@link #stepSenseSample} adds the measurement view and the recorder sample.
 *
 * <p>The plant is re-initialised to the settled point every simulated second (one
 * {@code initialise} per 20,000 steps at 50 us, allocation-free), because nothing regulates
 * an open-loop plant; a trip would make the numbers those of a blocked plant, which the
 * iteration tear-down rejects.
 *
 * <p>Run: {@code java -jar tests/target/benchmarks.jar PlantStepBenchmark -bm sample -tu ns}
 * (median and p99 per operation), or {@code -prof gc} to see 0 B/op.
 */
@State(Scope.Thread)
@BenchmarkMode(Mode.SampleTime)
@OutputTimeUnit(TimeUnit.NANOSECONDS)
@Warmup(iterations = 3, time = 2)
@Measurement(iterations = 5, time = 2)
@Fork(value = 1, jvmArgsAppend = {"-XX:+UseParallelGC", "-Xms512m", "-Xmx512m"})
public class PlantStepBenchmark {
    @Param({"50000"})
    public long stepPeriodNs;

    private TurbinePlant plant;
    private OperatingPoint op;
    private final BoardCommand command = new BoardCommand();
    private final SensorView view = new SensorView();
    private double[] sample;
    private double halfStepS;
    private long reinitialiseSteps;

    @Setup(Level.Trial)
    public void setUp() {
        TurbineParameters p = TurbineFile.defaults();
        op = SteadyState.solve(p, 9.0, 1.0, 0.0);
        plant = new TurbinePlant(p, stepPeriodNs);
        plant.initialise(op);
        sample = new double[plant.signalCount()];
        halfStepS = 0.5 * stepPeriodNs * 1e-9;
        reinitialiseSteps = 1_000_000_000L / stepPeriodNs;
    }

    @TearDown(Level.Iteration)
    public void checkHealthy() {
        if (plant.tripFlags() != 0) {
            throw new IllegalStateException("plant tripped (flags " + plant.tripFlags() + "): the numbers would be of a blocked plant");
        }
    }

    private BoardCommand command() {
        // open loop drifts slowly (nothing regulates the DC link); start again from the settled
        // point every simulated second so every sample is a healthy, unblocked plant
        if (plant.stepCount() >= reinitialiseSteps) {
            plant.initialise(op);
        }
        op.fillCommand(command,
                plant.generatorElectricalAngleRad() + halfStepS * plant.generatorElectricalSpeedRadPerS(),
                plant.gridAngleRad() + halfStepS * plant.gridAngularFrequencyRadPerS(),
                plant.dcLinkVoltageV());
        return command;
    }

    @Benchmark
    public double commandOnly() {
        return command().gscDutyA;
    }

    @Benchmark
    public long step() {
        plant.step(command());
        return plant.stepCount();
    }

    @Benchmark
    public double stepSenseSample() {
        plant.step(command());
        plant.sense(view);
        plant.sample(sample);
        return view.dcLinkVoltageV + sample[0];
    }
}
