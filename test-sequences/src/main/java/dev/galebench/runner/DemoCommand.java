package dev.galebench.runner;

import dev.galebench.cli.GalebenchCommand;
import dev.galebench.sequence.SequenceLibrary;
import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.io.PrintWriter;
import java.net.URISyntaxException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;
import java.util.concurrent.TimeUnit;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/**
 * {@code galebench demo [--out DIR]}: the whole bench on one machine. Starts the virtual board
 * as a separate process ({@code galebench board --udp 127.0.0.1:0}, same java and jar), runs a
 * library sequence against it in real time over UDP loopback, stops the board, and says where
 * the report is. Exit codes as {@code run}.
 */
@Command(name = "demo", mixinStandardHelpOptions = true,
        description = {"Runs the demo end to end: the virtual board as its own process over UDP loopback, a "
                + "fault ride-through sequence in real time, and the report.",
            "Exit codes: 0 all checks passed, 1 a check failed or the run aborted, 2 bad input."})
public final class DemoCommand implements Callable<Integer> {
    private static final Pattern LISTENING = Pattern.compile("listening on udp ([0-9.]+):([0-9]+)");

    @Spec
    CommandSpec spec;

    @Option(names = "--out", paramLabel = "DIR", defaultValue = "runs", description = "Parent of the run folder (default: ${DEFAULT-VALUE}).")
    Path out;

    @Option(names = "--sequence", paramLabel = "NAME", defaultValue = "dip-3ph-50pct",
            description = "Library sequence to run (default: ${DEFAULT-VALUE}).")
    String sequence;

    @Option(names = "--reply-wait-us", paramLabel = "N", defaultValue = "20000",
            description = "Paced exchange: wait up to N us for a late reply of the board, pausing plant time (counted as "
                    + "overruns), so a stall of this shared PC shows in the timing report instead of tripping the plant; "
                    + "0 = strict real time (default: ${DEFAULT-VALUE}).")
    double replyWaitUs;

    @Option(names = "--pin-cpu", paramLabel = "CPU", defaultValue = "-1",
            description = "Real time: pin the loop thread to this CPU and keep this process's other threads off it "
                    + "(Linux, taskset; see rt-plant/LOOP.md); -1 = no pinning (default).")
    int pinCpu;

    @Option(names = "--quiet", description = "No progress bar.")
    boolean quiet;

    @picocli.CommandLine.Mixin
    dev.galebench.dashboard.DashboardOption dashboard;

    @Override
    public Integer call() throws Exception {
        PrintWriter w = spec.commandLine().getOut();
        var seq = SequenceLibrary.load(sequence);
        final int pin = RunCommand.checkPinCpu(pinCpu);
        List<String> cmd = boardCommand(seq.stepUs() * seq.exchangeEvery(), pin);
        w.println("demo: starting the virtual board: " + String.join(" ", cmd));
        w.flush();
        Process board = new ProcessBuilder(cmd).redirectErrorStream(false)
                .redirectError(ProcessBuilder.Redirect.INHERIT).start();
        try {
            String port = awaitPort(board);
            String uri = "udp://127.0.0.1:" + port;
            w.println("demo: board listening on " + uri + "; running " + sequence + " in real time");
            w.flush();
            SequenceRunner.Options o = new SequenceRunner.Options();
            o.board = uri;
            o.outBase = out;
            o.progress = !quiet;
            o.replyWaitUs = replyWaitUs;
            o.pinCpu = pin;
            SequenceRunner.Result r;
            try (dev.galebench.dashboard.Dashboard d = dashboard.startIfAsked(
                    dev.galebench.dashboard.BenchControl.watchOnly(seq.name(), () -> { }), into -> { }, w)) {
                o.dashboard = d;
                // with a console: pending checks, verdicts as they fall, the report link
                r = dev.galebench.cli.serve.WatchedRun.run(d, seq.name(), seq, o);
            }
            RunCommand.print(w, r);
            w.println("demo: report " + r.folder().resolve("report.html").toAbsolutePath());
            w.flush();
            return r.passed() ? GalebenchCommand.EXIT_OK : GalebenchCommand.EXIT_FAILED;
        } finally {
            board.destroy();
            if (!board.waitFor(5, TimeUnit.SECONDS)) {
                board.destroyForcibly();
            }
        }
    }

    /** Same java, same jar (or class path), {@code board --udp 127.0.0.1:0 --controller reference}. */
    /**
     * The board process's command line; with {@code pinCpu >= 0} it starts under
     * {@code taskset -c} with every CPU but that one, so the board never takes the loop's core.
     */
    static List<String> boardCommand(double periodUs, int pinCpu) throws URISyntaxException {
        String java = ProcessHandle.current().info().command().orElse(Path.of(System.getProperty("java.home"), "bin",
                "java").toString());
        List<String> cmd = new ArrayList<>();
        final int n = Runtime.getRuntime().availableProcessors();
        if (pinCpu >= 0 && n > 1 && Files.isExecutable(Path.of("/usr/bin/taskset"))) {
            StringBuilder others = new StringBuilder();
            for (int c = 0; c < n; c++) {
                if (c != pinCpu) {
                    others.append(others.length() == 0 ? "" : ",").append(c);
                }
            }
            cmd.add("/usr/bin/taskset");
            cmd.add("-c");
            cmd.add(others.toString());
        }
        cmd.add(java);
        cmd.add("-Xmx256m");
        Path self = Path.of(GalebenchCommand.class.getProtectionDomain().getCodeSource().getLocation().toURI());
        if (self.toString().endsWith(".jar")) {
            cmd.add("-jar");
            cmd.add(self.toString());
        } else {
            cmd.add("-cp");
            cmd.add(System.getProperty("java.class.path"));
            cmd.add(GalebenchCommand.class.getName());
        }
        cmd.add("board");
        cmd.add("--udp");
        cmd.add("127.0.0.1:0");
        cmd.add("--controller");
        cmd.add("reference");
        cmd.add("--period-us");
        cmd.add(Double.toString(periodUs));
        return cmd;
    }

    /** Reads the board's first line ("... listening on udp 127.0.0.1:PORT ...") within 30 s. */
    static String awaitPort(Process board) throws IOException, InterruptedException {
        BufferedReader r = new BufferedReader(new InputStreamReader(board.getInputStream(), StandardCharsets.UTF_8));
        final String[] line = new String[1];
        Thread t = new Thread(() -> {
            try {
                line[0] = r.readLine();
            } catch (IOException e) {
                line[0] = null;
            }
        }, "galebench-demo-board-out");
        t.setDaemon(true);
        t.start();
        t.join(30_000);
        if (line[0] == null) {
            throw new IllegalStateException("the virtual board did not start (no 'listening' line within 30 s; exit "
                    + (board.isAlive() ? "still running" : board.exitValue()) + ")");
        }
        Matcher m = LISTENING.matcher(line[0]);
        if (!m.find()) {
            throw new IllegalStateException("the virtual board said '" + line[0] + "', not where it listens");
        }
        // keep draining its output so it never blocks on a full pipe
        Thread drain = new Thread(() -> {
            try {
                while (r.readLine() != null) {
                    // discard
                }
            } catch (IOException e) {
                // board gone
            }
        }, "galebench-demo-board-drain");
        drain.setDaemon(true);
        drain.start();
        return m.group(2);
    }
}
