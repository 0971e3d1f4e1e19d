package dev.galebench.cli.serve;

import dev.galebench.dashboard.Dashboard;
import dev.galebench.dashboard.Verdict;
import dev.galebench.report.CheckOutcome;
import dev.galebench.runner.SequenceRunner;
import dev.galebench.sequence.Sequence;

import java.io.IOException;
import java.util.ArrayList;
import java.util.List;

/**
 * One sequence run shown on a console. The runner itself feeds the console (its feed joins the
 * run's ring consumers, its timing source follows the run's loop, and for the length of the run
 * the console's bench is the runner's watch-and-abort bench); this adds what only the caller
 * knows: the run's name on every console, its checks listed as pending, then its verdicts and
 * the link to its report. Usable by any command that runs a sequence with a console
 * ({@code serve}; {@code run}/{@code demo --dashboard} can call it too).
 */
public final class WatchedRun {
    private WatchedRun() {
    }

    /**
     * Runs {@code seq} with {@code options}, shown on {@code console} under {@code runId}
     * (null console: just runs it).
     */
    public static SequenceRunner.Result run(Dashboard console, String runId, Sequence seq, SequenceRunner.Options options)
            throws IOException, InterruptedException {
        if (console == null) {
            return new SequenceRunner().run(seq, options);
        }
        options.dashboard = console;
        List<String> checks = new ArrayList<>();
        seq.checks().forEach(c -> checks.add(c.name()));
        console.sequenceStarted(seq.name(), runId, checks);
        // verdicts as they fall: each check's as soon as its window has passed, final ones below
        options.verdictListener = c -> console.verdict(
                new Verdict(c.name(), c.kind(), c.passed(), c.measured(), c.required(), c.message()), c.windowEndS());
        SequenceRunner.Result r;
        try {
            r = new SequenceRunner().run(seq, options);
        } catch (IOException | InterruptedException | RuntimeException e) {
            console.log("sequence " + seq.name() + " could not run: " + e.getMessage());
            console.sequenceFinished(seq.name(), runId, "aborted", null, null);
            throw e;
        }
        for (CheckOutcome c : r.outcomes()) {
            console.verdict(new Verdict(c.name(), c.kind(), c.passed(), c.measured(), c.required(), c.message()),
                    c.windowEndS());
        }
        String outcome = r.abortReason() != null ? "aborted" : r.passed() ? "passed" : "failed";
        console.sequenceFinished(seq.name(), runId, outcome, r.folder(), "report.html");
        return r;
    }
}
