package dev.galebench.cli.serve;

import dev.galebench.cli.GalebenchCommand;
import dev.galebench.dashboard.Dashboard;
import dev.galebench.dashboard.DashboardOptions;
import dev.galebench.plant.TurbineFile;
import dev.galebench.plant.TurbineParameters;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.time.ZoneOffset;
import java.time.ZonedDateTime;
import java.time.format.DateTimeFormatter;
import java.util.concurrent.Callable;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;

/**
 * {@code galebench serve}: the interactive bench with the live web console. Runs until
 * interrupted (Ctrl-C) or for {@code --seconds}. Exit codes: 0 after a normal stop, 2 for bad
 * options (named in the message).
 */
@Command(name = "serve", mixinStandardHelpOptions = true,
        description = {"Interactive bench with the live web console: the plant runs in real time against the board; "
                + "the browser shows live plots, loop timing and link counters, starts library sequences and drives the "
                + "bench (wind, dip/swell, voltage-deviation reference, link faults). Every control is logged in the "
                + "session folder.",
            "Exit codes: 0 after a normal stop, 2 for bad options."})
public final class ServeCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Option(names = "--port", paramLabel = "N", description = "TCP port of the console (default ${DEFAULT-VALUE}; 0 = any free port).")
    int port = DashboardOptions.DEFAULT_PORT;

    @Option(names = "--bind", paramLabel = "ADDR", description = "Address to listen on (default ${DEFAULT-VALUE}); anything but loopback needs --token.")
    String bind = "127.0.0.1";

    @Option(names = "--token", paramLabel = "T", description = "Access token (8+ characters); every control request must carry it, on loopback too.")
    String token;

    @Option(names = "--allow-viewers", description = "With --token: clients without it may watch read-only.")
    boolean allowViewers;

    @Option(names = "--board", paramLabel = "BOARD", description = "virtual (in-process virtual board, default), udp://HOST:PORT or serial:DEVICE[@BAUD].")
    String board = "virtual";

    @Option(names = "--controller", paramLabel = "NAME", description = "Control law of the virtual board (default: the reference controller when built in).")
    String controller;

    @Option(names = "--turbine", paramLabel = "FILE", description = "Turbine file (default: the built-in 4 MW turbine).")
    Path turbine;

    @Option(names = "--step-us", paramLabel = "US", description = "Plant step, us (default ${DEFAULT-VALUE}).")
    double stepUs = 50.0;

    @Option(names = "--wind", paramLabel = "M_S", description = "Wind of the first free run, m/s (default ${DEFAULT-VALUE}).")
    double windMPerS = 10.0;

    @Option(names = "--runs", paramLabel = "DIR", description = "Folder for session logs and runs (default ${DEFAULT-VALUE}).")
    Path runsDir = Path.of("runs");

    @Option(names = "--hold-s", paramLabel = "S", description = "After a sequence, keep its plots this long before the free run resumes (default ${DEFAULT-VALUE}).")
    double holdS = 10.0;

    @Option(names = "--pin-cpu", paramLabel = "CPU", defaultValue = "-1",
            description = "Pin the loop thread to this CPU and keep this process's other threads (console included) off it "
                    + "(Linux, taskset; see rt-plant/LOOP.md); -1 = no pinning (default).")
    int pinCpu;

    @Option(names = "--seconds", paramLabel = "S", description = "Stop after S seconds of wall time (default 0 = until interrupted).")
    double seconds;

    private final CountDownLatch stop = new CountDownLatch(1);

    private volatile Dashboard running;

    /** Port of the running console, or -1 before it listens (tests, embedding). */
    public int port() {
        Dashboard d = running;
        return d == null ? -1 : d.port();
    }

    /** Stops a running {@link #call()} as Ctrl-C would (tests, embedding). */
    public void stop() {
        stop.countDown();
    }

    @Override
    public Integer call() throws Exception {
        PrintWriter out = spec.commandLine().getOut();
        if (!(stepUs >= 10 && stepUs <= 1000)) {
            throw new IllegalArgumentException("--step-us " + stepUs + " is outside 10 .. 1000 us");
        }
        if (!(windMPerS >= 0 && windMPerS <= 40)) {
            throw new IllegalArgumentException("--wind " + windMPerS + " is outside 0 .. 40 m/s");
        }
        if (!(holdS >= 0 && holdS <= 3600)) {
            throw new IllegalArgumentException("--hold-s " + holdS + " is outside 0 .. 3600 s");
        }
        if (!(seconds >= 0)) {
            throw new IllegalArgumentException("--seconds must be 0 or more");
        }
        DashboardOptions options = DashboardOptions.loopback(port).withBindAddress(bind).withToken(token, allowViewers).validated();
        TurbineParameters params = turbine == null ? TurbineFile.defaults() : TurbineFile.load(turbine);
        String law = controller == null ? ServeBench.defaultController() : controller;
        if ("virtual".equals(board)) {
            dev.galebench.board.BoardControllers.create(law); // names the choices if unknown
        }
        String stamp = ZonedDateTime.now(ZoneOffset.UTC).format(DateTimeFormatter.ofPattern("yyyyMMdd-HHmmss"));
        ServeBench bench = new ServeBench(new ServeBench.Settings(params, Math.round(stepUs * 1000), board, law, windMPerS,
                runsDir.resolve("serve-" + stamp), holdS, dev.galebench.runner.RunCommand.checkPinCpu(pinCpu)));
        CountDownLatch closed = new CountDownLatch(1);
        // On SIGTERM/Ctrl-C: wake the main thread and give it time to stop the loop and the server.
        Thread hook = new Thread(() -> {
            stop.countDown();
            try {
                closed.await(20, TimeUnit.SECONDS);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
        }, "galebench-serve-stop");
        try (Dashboard console = Dashboard.start(options, bench, null)) {
            bench.start(console);
            running = console;
            Runtime.getRuntime().addShutdownHook(hook);
            out.println("galebench serve: live console at " + console.url());
            out.println("session folder: " + bench.sessionDir().toAbsolutePath());
            out.println(seconds > 0 ? "stopping after " + seconds + " s" : "Ctrl-C stops");
            out.flush();
            if (seconds > 0) {
                stop.await(Math.round(seconds * 1000), TimeUnit.MILLISECONDS);
            } else {
                stop.await();
            }
        } finally {
            running = null;
            bench.close();
            closed.countDown();
            try {
                Runtime.getRuntime().removeShutdownHook(hook);
            } catch (IllegalStateException shuttingDown) {
                // the JVM is already stopping: the hook has run
            }
        }
        out.println("galebench serve: stopped");
        out.flush();
        return GalebenchCommand.EXIT_OK;
    }
}
