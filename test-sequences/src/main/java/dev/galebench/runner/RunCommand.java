package dev.galebench.runner;

import dev.galebench.cli.GalebenchCommand;
import dev.galebench.report.CheckOutcome;
import dev.galebench.sequence.Sequence;
import dev.galebench.sequence.SequenceLibrary;
import java.io.PrintStream;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/**
 * {@code galebench run SEQUENCE [--board ...] [--offline] [--out DIR] [--step-us N]
 * [--exchange-every M] [--csv]}: runs one sequence and writes its run folder. Exit 0 when every
 * check passed, 1 when a check failed or the run aborted, 2 for bad input.
 */
@Command(name = "run", mixinStandardHelpOptions = true,
        description = {"Runs a sequence against a board (real time) or the virtual board (offline) and writes a "
                + "run folder with report.html, junit.xml, COMTRADE, timing.hlog and summary.json.",
            "Exit codes: 0 all checks passed, 1 a check failed or the run aborted, 2 bad input."})
public final class RunCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Parameters(index = "0", paramLabel = "SEQUENCE", description = "A sequence file or a library name (see: galebench sequences).")
    String sequence;

    @Option(names = "--board", paramLabel = "virtual|udp://HOST:PORT|serial:DEVICE[@BAUD]", defaultValue = "virtual",
            description = "The board: the in-process reference controller (default), or a board over UDP or serial.")
    String board;

    @Option(names = "--offline", description = "Run as fast as possible with the virtual board in-process (no clock).")
    boolean offline;

    @Option(names = "--out", paramLabel = "DIR", defaultValue = "runs",
            description = "Parent folder of the run folder (default: ${DEFAULT-VALUE}).")
    Path out;

    @Option(names = "--step-us", paramLabel = "N", description = "Plant step in microseconds (default: the sequence's).")
    Double stepUs;

    @Option(names = "--exchange-every", paramLabel = "M", description = "Exchange with the board every M plant steps (default: the sequence's).")
    Integer exchangeEvery;

    @Option(names = "--reply-wait-us", paramLabel = "N", defaultValue = "0",
            description = "Real time with a board: 0 (default) = strict, a late reply is stepped past with the last good command; "
                    + "N > 0 = paced exchange, wait up to N us for a late reply and pause plant time instead (counted as overruns).")
    double replyWaitUs;

    @Option(names = "--csv", description = "Also write signals.csv (every signal, every exchange).")
    boolean csv;

    @Option(names = "--pin-cpu", paramLabel = "CPU", defaultValue = "-1",
            description = "Real time: pin the loop thread to this CPU and keep this process's other threads off it "
                    + "(Linux, taskset; see rt-plant/LOOP.md); -1 = no pinning (default).")
    int pinCpu;

    @Option(names = "--quiet", description = "No progress bar.")
    boolean quiet;

    @picocli.CommandLine.Mixin
    dev.galebench.dashboard.DashboardOption dashboard;

    /** Validates a --pin-cpu value against this machine's CPUs. */
    public static int checkPinCpu(int cpu) {
        final int n = Runtime.getRuntime().availableProcessors();
        if (cpu < -1 || cpu >= n) {
            throw new IllegalArgumentException("--pin-cpu " + cpu + " is outside -1 .. " + (n - 1) + " (this machine has " + n + " CPUs)");
        }
        return cpu;
    }

    @Override
    public Integer call() throws Exception {
        final PrintStream err = System.err;
        if (stepUs != null && !(stepUs >= 1 && stepUs <= 1000)) {
            throw new IllegalArgumentException("--step-us " + stepUs + " is outside 1 .. 1000 us");
        }
        if (exchangeEvery != null && !(exchangeEvery >= 1 && exchangeEvery <= 10_000)) {
            throw new IllegalArgumentException("--exchange-every " + exchangeEvery + " is outside 1 .. 10000");
        }
        if (!board.equals("virtual") && !board.startsWith("udp://") && !board.startsWith("serial:")) {
            throw new IllegalArgumentException("--board " + board + ": give virtual, udp://HOST:PORT or serial:DEVICE[@BAUD]");
        }
        Sequence seq = SequenceLibrary.resolve(sequence);
        SequenceRunner.Options o = new SequenceRunner.Options();
        o.board = board;
        o.offline = offline;
        o.outBase = out;
        o.stepUs = stepUs == null ? Double.NaN : stepUs;
        o.exchangeEvery = exchangeEvery == null ? 0 : exchangeEvery;
        if (!(replyWaitUs >= 0 && replyWaitUs <= 10_000_000)) {
            throw new IllegalArgumentException("--reply-wait-us " + replyWaitUs + " is outside 0 .. 10000000");
        }
        o.replyWaitUs = replyWaitUs;
        o.pinCpu = checkPinCpu(pinCpu);
        o.csv = csv;
        o.progress = !quiet;
        o.err = err;
        SequenceRunner.Result r;
        try (dev.galebench.dashboard.Dashboard d = dashboard.startIfAsked(
                dev.galebench.dashboard.BenchControl.watchOnly(seq.name(), () -> { }), into -> { },
                spec.commandLine().getOut())) {
            o.dashboard = d;
            // with a console: pending checks, verdicts as they fall, the report link
                r = dev.galebench.cli.serve.WatchedRun.run(d, seq.name(), seq, o);
        }
        print(spec.commandLine().getOut(), r);
        return r.passed() ? GalebenchCommand.EXIT_OK : GalebenchCommand.EXIT_FAILED;
    }

    /** The verdict lines every run command prints: one per check, then the total and the folder. */
    static void print(java.io.PrintWriter out, SequenceRunner.Result r) {
        int failed = 0;
        for (CheckOutcome c : r.outcomes()) {
            out.printf("%s  %-24s %-16s measured %s; required %s%n", c.passed() ? "PASS" : "FAIL", c.name(), c.kind(),
                    c.measured(), c.required());
            if (!c.passed()) {
                failed++;
                out.println("      " + c.message());
            }
        }
        if (r.abortReason() != null) {
            out.println("ABORTED: " + r.abortReason());
        }
        out.printf("%s: %d of %d checks passed; report: %s%n", r.passed() ? "PASSED" : "FAILED",
                r.outcomes().size() - failed, r.outcomes().size(), r.folder().resolve("report.html"));
        out.flush();
    }
}
