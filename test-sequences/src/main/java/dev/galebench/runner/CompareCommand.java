package dev.galebench.runner;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import dev.galebench.check.Fmt;
import dev.galebench.cli.GalebenchCommand;
import dev.galebench.report.plot.SvgLinePlot;
import java.io.PrintWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/**
 * {@code galebench compare RUN_A RUN_B [--signals ...]}: back-to-back comparison of two run
 * folders (e.g. the offline golden run and a board run): per signal the maximum and RMS
 * deviation, the lag by cross-correlation, and a verdict against tolerances; writes
 * {@code compare.html} (plots of A and B), {@code compare.json} and one SVG per signal.
 * Exit 0 if every signal is within tolerance, 1 otherwise, 2 for bad input.
 */
@Command(name = "compare", mixinStandardHelpOptions = true,
        description = {"Compares the recorded waveforms of two run folders: max and RMS deviation, lag by "
                + "cross-correlation, verdict against tolerances, plots.",
            "Exit codes: 0 all signals within tolerance, 1 a signal out of tolerance, 2 bad input."})
public final class CompareCommand implements Callable<Integer> {
    /** Signals compared when --signals is not given (those recorded in both runs). */
    static final List<String> DEFAULT_SIGNALS = List.of("v_term_pu", "v_poc_pu", "v_dc_v", "p_grid_pu", "q_grid_pu",
            "i_active_pu", "i_reactive_pu", "rotor_speed_rad_s", "pitch_deg", "t_gen_nm");

    @Spec
    CommandSpec spec;

    @Parameters(index = "0", paramLabel = "RUN_A", description = "Reference run folder (e.g. the offline golden run).")
    Path runA;

    @Parameters(index = "1", paramLabel = "RUN_B", description = "Run folder to compare with it.")
    Path runB;

    @Option(names = "--signals", split = ",", paramLabel = "NAME[,NAME...]", description = "Signals to compare (default: "
            + "v_term_pu, v_poc_pu, v_dc_v, p_grid_pu, q_grid_pu, i_active_pu, i_reactive_pu, rotor_speed_rad_s, pitch_deg, t_gen_nm).")
    List<String> signals;

    @Option(names = "--tolerance", paramLabel = "NAME=VALUE", description = "Largest allowed deviation of a signal, in its unit (repeatable).")
    Map<String, Double> tolerances = new LinkedHashMap<>();

    @Option(names = "--default-tolerance-pct", paramLabel = "PCT", defaultValue = "2",
            description = "Tolerance of signals without --tolerance, in % of run A's range of the signal (default: ${DEFAULT-VALUE}).")
    double defaultPercent;

    @Option(names = "--max-lag-ms", paramLabel = "MS", defaultValue = "5",
            description = "Largest lag searched by cross-correlation (default: ${DEFAULT-VALUE} ms).")
    double maxLagMs;

    @Option(names = "--out", paramLabel = "DIR", description = "Folder for compare.html/json and plots (default: RUN_B/compare).")
    Path out;

    @Override
    public Integer call() throws Exception {
        for (Path p : List.of(runA, runB)) {
            if (!Files.isDirectory(p)) {
                throw new IllegalArgumentException(p + ": not a run folder");
            }
        }
        if (!(defaultPercent > 0) || !(maxLagMs >= 0)) {
            throw new IllegalArgumentException("--default-tolerance-pct must be > 0 and --max-lag-ms >= 0");
        }
        List<String> sig = signals;
        if (sig == null) {
            sig = new ArrayList<>();
            var a = dev.galebench.report.comtrade.ComtradeConfig.read(RunComparison.cfgOf(runA));
            var b = dev.galebench.report.comtrade.ComtradeConfig.read(RunComparison.cfgOf(runB));
            for (String s : DEFAULT_SIGNALS) {
                if (a.analogIndexOf(s) >= 0 && b.analogIndexOf(s) >= 0) {
                    sig.add(s);
                }
            }
        }
        var cfgA = dev.galebench.report.comtrade.ComtradeConfig.read(RunComparison.cfgOf(runA));
        double rate = cfgA.sampleRates.isEmpty() ? 20_000 : cfgA.sampleRates.get(0).rateHz();
        int maxLag = (int) Math.round(maxLagMs * 1e-3 * (rate > 0 ? rate : 20_000));
        List<RunComparison.SignalDiff> diffs = RunComparison.compare(runA, runB, sig, tolerances, defaultPercent, maxLag);
        Path dir = out != null ? out : runB.resolve("compare");
        write(dir, diffs);
        PrintWriter w = spec.commandLine().getOut();
        boolean all = true;
        for (RunComparison.SignalDiff d : diffs) {
            w.println(RunComparison.line(d));
            all &= d.passed();
        }
        w.println((all ? "WITHIN TOLERANCE" : "OUT OF TOLERANCE") + ": " + runB + " vs " + runA + "; plots: "
                + dir.resolve("compare.html"));
        w.flush();
        return all ? GalebenchCommand.EXIT_OK : GalebenchCommand.EXIT_FAILED;
    }

    private void write(Path dir, List<RunComparison.SignalDiff> diffs) throws java.io.IOException {
        Files.createDirectories(dir);
        List<Map<String, Object>> rows = new ArrayList<>();
        StringBuilder rowsHtml = new StringBuilder();
        StringBuilder plots = new StringBuilder();
        boolean all = true;
        for (RunComparison.SignalDiff d : diffs) {
            all &= d.passed();
            Map<String, Object> r = new LinkedHashMap<>();
            r.put("signal", d.signal());
            r.put("unit", d.unit());
            r.put("passed", d.passed());
            r.put("samples", d.samples());
            r.put("max_abs", d.maxAbs());
            r.put("max_at_s", d.maxAtS());
            r.put("rms", d.rms());
            r.put("lag_s", d.lagS());
            r.put("correlation", d.correlation());
            r.put("tolerance", d.tolerance());
            r.put("resolution", d.resolution());
            rows.add(r);
            rowsHtml.append(Page.render("compare-row.html", Map.of("signal", d.signal(),
                    "verdict_class", d.passed() ? "pass" : "fail", "verdict", d.passed() ? "PASS" : "FAIL",
                    "max", Fmt.value(d.maxAbs(), d.unit()), "at", Fmt.time(d.maxAtS()), "rms", Fmt.value(d.rms(), d.unit()),
                    "lag", Fmt.duration(d.lagS()), "r", String.format(java.util.Locale.ROOT, "%.4f", d.correlation()),
                    "tolerance", Fmt.value(d.tolerance(), d.unit()), "resolution", Fmt.value(d.resolution(), d.unit()))));
            SvgLinePlot plot = new SvgLinePlot(900, 260).id("cmp-" + d.signal()).title(d.signal() + ": A and B")
                    .xAxis("plant time", "s").yAxis(d.signal(), d.unit())
                    .addSeries("A", d.plotT(), d.plotA()).addSeries("B", d.plotT(), d.plotB());
            plot.writeTo(dir.resolve(d.signal() + ".svg"));
            plots.append(Page.render("compare-plot.html", Map.of("signal", d.signal(), "svg", plot.toSvgElement())));
        }
        String html = Page.render("compare-page.html", Map.of("run_a", runA.toString(), "run_b", runB.toString(),
                "verdict", all ? "within tolerance" : "OUT OF TOLERANCE", "rows", rowsHtml.toString(),
                "plots", plots.toString(), "plot_css", Page.resource("/dev/galebench/report/plot.css")));
        Files.writeString(dir.resolve("compare.html"), html, StandardCharsets.UTF_8);
        Files.writeString(dir.resolve("compare.json"), new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT)
                .writeValueAsString(Map.of("run_a", runA.toString(), "run_b", runB.toString(), "signals", rows)),
                StandardCharsets.UTF_8);
    }

}
