package dev.galebench.bench;

import dev.galebench.board.control.ControllerFile;
import dev.galebench.board.control.ReferenceController;
import dev.galebench.plant.BoardCommand;
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
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Warmup;

/**
 * One offline closed-loop step (h = 50 us, exchange every step): sense, reference-controller
 * update, plant step; and the plant step alone as the floor, in the same run so the ratio holds
 * on a noisy machine. Real-time factor = 50 us / (time per closed-loop step). The plant is
 * re-initialised every iteration (10 m/s, a settled operating point); the controller runs its
 * full path (PLL, both converters, FRT supervision, protection) at every call. The floor steps
 * the plant with a held command (open loop); over one iteration it stays near its operating
 * point, so its cost is representative.
 *
 * <p>Run: {@code mvn -q -B package -pl tests -am -DskipTests && java -jar tests/target/benchmarks.jar ClosedLoopBenchmark -prof gc}
 */
@State(Scope.Thread)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.NANOSECONDS)
@Warmup(iterations = 3, time = 1)
@Measurement(iterations = 5, time = 1)
@Fork(value = 1, jvmArgsAppend = {"-Xms512m", "-Xmx512m"})
public class ClosedLoopBenchmark {
    private TurbinePlant plant;
    private ReferenceController controller;
    private final SensorView view = new SensorView();
    private final BoardCommand command = new BoardCommand();

    @Setup(Level.Iteration)
    public void setUp() {
        final TurbineParameters p = TurbineFile.defaults();
        plant = new TurbinePlant(p, 50_000L);
        plant.initialise(SteadyState.solve(p, 10.0, 1.0, 0.0));
        controller = new ReferenceController(p, ControllerFile.defaults());
        controller.setSamplePeriod(50e-6);
        plant.sense(view);
        controller.start(view);
    }

    /** Sense + controller update + plant step: one exchange of an offline run. */
    @Benchmark
    public BoardCommand closedLoopStep() {
        plant.sense(view);
        controller.update(view, command);
        plant.step(command);
        return command;
    }

    /** Plant step alone with the last command (the floor). */
    @Benchmark
    public TurbinePlant plantStep() {
        plant.step(command);
        return plant;
    }
}
