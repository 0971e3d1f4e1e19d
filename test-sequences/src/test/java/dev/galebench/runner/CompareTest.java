package dev.galebench.runner;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.galebench.cli.GalebenchCommand;
import dev.galebench.plant.TurbineFile;
import dev.galebench.report.recording.ComtradeRecorder;
import dev.galebench.report.recording.ComtradeSettings;
import dev.galebench.report.recording.SignalRanges;
import dev.galebench.testsupport.AnalyticFeed;
import dev.galebench.testsupport.Layouts;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import java.util.function.DoubleUnaryOperator;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import picocli.CommandLine;

/** Back-to-back comparison on COMTRADE recordings written by the real recorder from analytic signals. */
class CompareTest {
    private static final long PERIOD_NS = 50_000;

    private static Path record(Path dir, DoubleUnaryOperator v, DoubleUnaryOperator p) throws Exception {
        Files.createDirectories(dir);
        ComtradeRecorder rec = new ComtradeRecorder(dir, "recording",
                ComtradeSettings.defaults("cmp", 50.0, new SignalRanges(TurbineFile.defaults())));
        new AnalyticFeed(Layouts.documented(), PERIOD_NS).with("v_term_pu", v).with("p_grid_pu", p)
                .run(rec, 40_000, 0);
        return dir;
    }

    private static DoubleUnaryOperator wave(double delayS) {
        return t -> 1.0 - 0.2 * Math.sin(2 * Math.PI * 2.0 * (t - delayS));
    }

    @Test
    void shouldFindTheLagAndTheDeviationOfADelayedCopy(@TempDir Path dir) throws Exception {
        Path a = record(dir.resolve("a"), wave(0), t -> 0.8);
        Path b = record(dir.resolve("b"), wave(0.002), t -> 0.8);
        List<RunComparison.SignalDiff> d = RunComparison.compare(a, b, List.of("v_term_pu", "p_grid_pu"),
                Map.of("v_term_pu", 0.001), 2.0, 100);
        RunComparison.SignalDiff v = d.get(0);
        assertEquals(0.002, v.lagS(), 50e-6, "B is 2 ms later");
        assertTrue(v.correlation() > 0.999, "r " + v.correlation());
        // a delay tau of 0.2 sin(2 pi f t) deviates by at most 0.2 * 2 sin(pi f tau) = 0.005027
        assertEquals(0.2 * 2 * Math.sin(Math.PI * 2.0 * 0.002), v.maxAbs(), 2 * v.resolution());
        assertFalse(v.passed(), "0.005 > tolerance 0.001");
        RunComparison.SignalDiff p = d.get(1);
        assertEquals(0.0, p.maxAbs(), 1e-12);
        assertEquals(0.0, p.lagS());
        assertTrue(p.passed());
    }

    @Test
    void shouldExitByVerdictAndWritePlots(@TempDir Path dir) throws Exception {
        Path a = record(dir.resolve("a"), wave(0), t -> 0.8);
        Path b = record(dir.resolve("b"), wave(0.002), t -> 0.8);
        assertEquals(1, run(a, b, "--signals", "v_term_pu", "--tolerance", "v_term_pu=0.001"));
        assertEquals(0, run(a, b, "--signals", "v_term_pu,p_grid_pu", "--tolerance", "v_term_pu=0.01"));
        assertTrue(Files.readString(b.resolve("compare/compare.html")).contains("<svg"));
        assertTrue(Files.isRegularFile(b.resolve("compare/v_term_pu.svg")));
        assertTrue(Files.readString(b.resolve("compare/compare.json")).contains("\"lag_s\""));
        assertEquals(2, run(a, b, "--signals", "no_such_signal"));
    }

    private static int run(Path a, Path b, String... more) {
        CommandLine cl = GalebenchCommand.commandLine();
        cl.setOut(new PrintWriter(new StringWriter()));
        cl.setErr(new PrintWriter(new StringWriter()));
        String[] args = new String[3 + more.length];
        args[0] = "compare";
        args[1] = a.toString();
        args[2] = b.toString();
        System.arraycopy(more, 0, args, 3, more.length);
        return cl.execute(args);
    }
}
