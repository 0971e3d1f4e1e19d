package dev.galebench.bench;

import dev.galebench.board.HoldController;
import dev.galebench.link.BoardLinks;
import dev.galebench.link.LinkOptions;
import dev.galebench.plant.BoardCommand;
import dev.galebench.plant.SensorView;
import dev.galebench.rt.BoardLink;
import dev.galebench.wire.CommandFrame;
import dev.galebench.wire.Crc32c;
import dev.galebench.wire.MeasurementFrame;
import dev.galebench.wire.WireProfile;
import java.nio.ByteBuffer;
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
 * Cost of the wire path on the real-time thread: encode and decode per profile, the CRC alone
 * (table-driven baseline against the intrinsic the codec uses), and a whole in-process exchange (encode, controller,
 * encode, decode, validate). Run with {@code -prof gc} to see 0 B/op:
 * {@code java -jar tests/target/benchmarks.jar WireCodecBenchmark -prof gc}.
 */
@State(Scope.Thread)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.NANOSECONDS)
@Warmup(iterations = 3, time = 1)
@Measurement(iterations = 5, time = 1)
@Fork(1)
public class WireCodecBenchmark {
    @Param({"FULL", "COMPACT"})
    public WireProfile profile;

    private final ByteBuffer buffer = ByteBuffer.allocateDirect(256);
    private final MeasurementFrame measurement = new MeasurementFrame();
    private final CommandFrame command = new CommandFrame();
    private final SensorView view = new SensorView();
    private final SensorView decodedView = new SensorView();
    private final BoardCommand reply = new BoardCommand();
    private final BoardCommand decoded = new BoardCommand();
    private BoardLink inProcess;
    private long sequence;

    @Setup(Level.Trial)
    public void setUp() {
        measurement.wrap(buffer, 0);
        command.wrap(buffer, 0);
        view.dcLinkVoltageV = 1100;
        view.gridVoltageAV = 563.4;
        view.statusFlags = SensorView.STATUS_BREAKER_CLOSED;
        reply.block(true);
        final HoldController c = new HoldController();
        c.setSamplePeriod(50e-6);
        inProcess = BoardLinks.inProcess(c, LinkOptions.defaults().profile(profile));
    }

    @TearDown(Level.Trial)
    public void tearDown() {
        inProcess.close();
    }

    private final Crc32c intrinsicCrc = new Crc32c();

    /** Baseline: the portable table-driven CRC (what the C kit does), one lookup per byte. */
    @Benchmark
    public int crcTableDriven() {
        return Crc32c.compute(buffer, 0, profile.measurementLength - 4);
    }

    /** The CRC the codec uses: java.util.zip.CRC32C, compiled to the CPU's CRC32 instruction. */
    @Benchmark
    public int crcIntrinsic() {
        return intrinsicCrc.of(buffer, 0, profile.measurementLength - 4);
    }

    @Benchmark
    public int encodeDecodeMeasurement() {
        final int n = measurement.encode(profile, sequence++, view);
        return measurement.decode(n, decodedView);
    }

    @Benchmark
    public int encodeDecodeCommand() {
        final long s = sequence++;
        final int n = command.encode(profile, s, s, reply);
        return command.decode(n, s, decoded);
    }

    @Benchmark
    public int inProcessExchange() {
        inProcess.send(sequence++, view);
        return inProcess.poll(decoded);
    }
}
