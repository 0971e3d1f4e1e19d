package dev.galebench.report;

import dev.galebench.report.comtrade.ComtradeConfig;
import dev.galebench.report.comtrade.ComtradeReader;
import dev.galebench.report.comtrade.DecimatedTraces;
import dev.galebench.report.plot.SvgLinePlot;
import dev.galebench.rt.LinkCounters;
import org.HdrHistogram.Histogram;
import org.HdrHistogram.HistogramIterationValue;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.time.LocalDateTime;
import java.time.ZoneOffset;
import java.time.format.DateTimeFormatter;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;

/**
 * Writes {@code report.html}: one self-contained page (inline CSS and SVG, no script, no font
 * or image from elsewhere) with the verdict table, a plot per check (its signal around its
 * window, the band it required, then the whole run), extra signal plots, timing percentiles
 * and histograms, link counters, environment and links to the other files of the run.
 *
 * <p>Markup and style are the templates under {@code /dev/galebench/report/html/}; this class
 * only fills them. Waveforms come from the run's COMTRADE recording, read in ONE pass with
 * min/max decimation ({@link DecimatedTraces#readWindows}); each plot holds at most
 * {@value #BUCKETS_PER_PLOT} x 2 points, so memory does not grow with the run's length and a
 * 10-minute run makes a page of a few hundred kilobytes.
 */
public final class HtmlReport {
    /** Buckets per plotted trace (two points each): about 2000 points. */
    static final int BUCKETS_PER_PLOT = 1000;
    private static final DateTimeFormatter WHEN = DateTimeFormatter.ofPattern("yyyy-MM-dd HH:mm:ss");

    private HtmlReport() {
    }

    /** Writes {@code runDir/report.html}. */
    public static Path write(Path runDir, RunReportInput in) throws IOException {
        Path file = runDir.resolve(RunReports.REPORT_HTML);
        Files.writeString(file, render(runDir, in, Instant.now()), StandardCharsets.UTF_8);
        return file;
    }

    /** The page as text; {@code writtenAt} is shown in the footer. */
    static String render(Path runDir, RunReportInput in, Instant writtenAt) throws IOException {
        List<String> notices = new ArrayList<>();
        if (in.abortedReason() != null) {
            notices.add(notice("error", "Run aborted.", in.abortedReason()));
        }
        if (in.samplesDropped() > 0) {
            notices.add(notice("warn", "Samples dropped.", in.samplesDropped()
                    + " samples were missed by a consumer of the sample ring; recordings and streaming checks have gaps."));
        }
        RecordingStats rs = in.recording();
        if (rs != null && rs.failure() != null) {
            notices.add(notice("error", "Recording stopped.", "The COMTRADE recorder failed (" + rs.failure() + "); "
                    + rs.unrecordedSamples() + " samples were not recorded."));
        }
        if (rs != null && rs.totalClamped() > 0) {
            StringBuilder which = new StringBuilder();
            rs.clampedSamples().forEach((k, n) -> which.append(which.length() == 0 ? "" : ", ").append(k).append(": ").append(n));
            notices.add(notice("warn", "Clipped samples in the recording.", rs.totalClamped()
                    + " samples were outside their channel's range and were recorded at the range limit (" + which
                    + "). Flat tops at the limit in those plots are the range, not the signal."));
        }
        // the recording's time 0 is its first sample, exchange 0, at plant time M x h
        Recording rec = Recording.open(runDir, in.comtradeBaseName(), in.stepPeriodNs() * (double) in.exchangeEverySteps() * 1e-9);
        if (rec.problem != null) {
            notices.add(notice("info", "No waveforms.", rec.problem));
        }

        // one pass over the recording for every plot of the page
        List<CheckOutcome> checks = in.checks();
        Set<String> fullSignals = new LinkedHashSet<>();
        for (CheckOutcome c : checks) {
            if (c.signal() != null) {
                fullSignals.add(c.signal());
            }
        }
        fullSignals.addAll(in.plotSignals());
        Map<String, DecimatedTraces.Trace> full = new HashMap<>();
        Map<Integer, DecimatedTraces.Trace> zoom = new HashMap<>();
        double[][] zoomRange = new double[checks.size()][];
        if (rec.reader != null) {
            List<DecimatedTraces.Window> windows = new ArrayList<>();
            List<Object> keys = new ArrayList<>();
            for (String s : fullSignals) {
                windows.add(new DecimatedTraces.Window(s, 0.0, rec.endS - rec.offsetS, BUCKETS_PER_PLOT));
                keys.add(s);
            }
            for (int i = 0; i < checks.size(); i++) {
                CheckOutcome c = checks.get(i);
                if (c.signal() == null || !Double.isFinite(c.windowStartS()) || !Double.isFinite(c.windowEndS())) {
                    continue;
                }
                double span = Math.max(c.windowEndS() - c.windowStartS(), 1e-3);
                double margin = Math.max(0.25 * span, 0.01);
                double from = Math.max(0.0, c.windowStartS() - margin);
                double to = Math.min(rec.endS, c.windowEndS() + margin);
                if (to > from && to > rec.offsetS) {
                    zoomRange[i] = new double[] {from, to};
                    windows.add(new DecimatedTraces.Window(c.signal(), Math.max(0.0, from - rec.offsetS), to - rec.offsetS,
                            BUCKETS_PER_PLOT));
                    keys.add(i);
                }
            }
            List<DecimatedTraces.Trace> traces = new ArrayList<>();
            for (DecimatedTraces.Trace t : DecimatedTraces.readWindows(rec.reader, windows)) {
                double[] plantTimeS = t.timeS().clone();
                for (int k = 0; k < plantTimeS.length; k++) {
                    plantTimeS[k] += rec.offsetS;
                }
                traces.add(new DecimatedTraces.Trace(t.id(), t.unit(), plantTimeS, t.value()));
            }
            for (int k = 0; k < traces.size(); k++) {
                if (keys.get(k) instanceof String s) {
                    full.put(s, traces.get(k));
                } else {
                    zoom.put((Integer) keys.get(k), traces.get(k));
                }
            }
        }

        StringBuilder rows = new StringBuilder();
        StringBuilder cards = new StringBuilder();
        for (int i = 0; i < checks.size(); i++) {
            CheckOutcome c = checks.get(i);
            String anchor = (i + 1) + "-" + c.name().replaceAll("[^A-Za-z0-9_-]", "_");
            Map<String, String> v = checkValues(c, anchor);
            rows.append(Template.of("check-row.html").render(v));
            v.put("signal", c.signal() == null ? "-" : c.signal());
            v.put("window", Double.isFinite(c.windowStartS()) && Double.isFinite(c.windowEndS())
                    ? fixed(c.windowStartS(), 3) + " .. " + fixed(c.windowEndS(), 3) + " s" : "-");
            v.put("zoom_plot", checkPlot("zoom-" + anchor, c, zoom.get(i), zoomRange[i], true, rec));
            v.put("full_plot", checkPlot("full-" + anchor, c, c.signal() == null ? null : full.get(c.signal()), null, false, rec));
            cards.append(Template.of("check-card.html").render(v));
        }
        if (checks.isEmpty()) {
            rows.append(Template.of("empty-note.html").render(Map.of("text", "This sequence has no checks.")));
            cards.append(Template.of("empty-note.html").render(Map.of("text", "No checks, no check plots.")));
        }

        String signalSection = "";
        String signalsLink = "";
        if (!in.plotSignals().isEmpty()) {
            StringBuilder sc = new StringBuilder();
            for (String s : in.plotSignals()) {
                DecimatedTraces.Trace t = full.get(s);
                SvgLinePlot p = new SvgLinePlot(1080, 240).id("signal-" + s).title(s).xAxis("plant time", "s")
                        .yAxis(s, t == null ? "" : t.unit()).xRange(0.0, rec.endS > 0 ? rec.endS : 1.0);
                if (t != null) {
                    p.addSeries(s, t.timeS(), t.value());
                }
                sc.append(Template.of("signal-card.html").render(Map.of("plot", p.toSvgElement())));
            }
            signalSection = Template.of("signal-section.html").render(Map.of("signal_cards", sc.toString()));
            signalsLink = "<a href=\"#signals\">Signals</a>";
        }

        Map<String, String> page = new HashMap<>();
        page.put("css", Template.resource("report.css"));
        page.put("plot_css", plotCss());
        page.put("sequence", in.sequenceName());
        page.put("verdict", in.verdict());
        page.put("verdict_word", in.passed() ? "pass" : "fail");
        page.put("description", in.description() == null ? "" : in.description());
        page.put("checks_passed", Long.toString(checks.size() - in.failedCheckCount()));
        page.put("checks_total", Integer.toString(checks.size()));
        page.put("started_at", LocalDateTime.ofInstant(in.startedAt(), ZoneOffset.UTC).format(WHEN));
        page.put("plant_duration", fixed(in.plantDurationS(), 3) + " s");
        page.put("step_exchange", trim(in.stepPeriodNs() / 1000.0) + " µs · M = " + in.exchangeEverySteps());
        page.put("exchanges", String.format(Locale.ROOT, "%,d", in.exchanges()));
        page.put("sequence_file", in.sequenceFile() == null ? "-" : in.sequenceFile());
        page.put("notices", String.join("\n", notices));
        page.put("signals_link", signalsLink);
        page.put("check_rows", rows.toString());
        page.put("check_cards", cards.toString());
        page.put("signal_section", signalSection);
        page.put("timing_rows", timingRow("Lateness", in.latenessNs()) + timingRow("Compute", in.computeNs())
                + timingRow("Round trip", in.roundTripNs()));
        page.put("overruns", Long.toString(in.overruns()));
        page.put("overruns_class", in.overruns() > 0 ? "bad" : "ok");
        page.put("dropped_class", in.samplesDropped() > 0 ? "bad" : "ok");
        page.put("samples_dropped", Long.toString(in.samplesDropped()));
        page.put("histograms", histogram("hist-lateness", "Lateness", in.latenessNs())
                + histogram("hist-compute", "Compute", in.computeNs())
                + histogram("hist-rtt", "Round trip", in.roundTripNs()));
        page.put("timing_log_note", in.timingLogFileName() == null
                ? Template.escape("No interval log was written for this run.")
                : "The per-interval histograms are in <a href=\"" + Template.escape(in.timingLogFileName()) + "\">"
                + Template.escape(in.timingLogFileName())
                + "</a> (HdrHistogram interval log, readable with HdrHistogram's HistogramLogReader and plotting tools).");
        page.put("link_table", linkTable(in.link()));
        page.put("environment_rows", environmentRows(in));
        page.put("file_rows", fileRows(runDir, in));
        page.put("channels", channelTable(rec, in.recording()));
        page.put("written_at", LocalDateTime.ofInstant(writtenAt, ZoneOffset.UTC).format(WHEN));
        return Template.of("report.html").render(page);
    }

    private static String plotCss() {
        try (var s = HtmlReport.class.getResourceAsStream("/dev/galebench/report/plot.css")) {
            return new String(s.readAllBytes(), StandardCharsets.UTF_8);
        } catch (IOException | NullPointerException e) {
            throw new IllegalStateException("plot.css missing from the classpath", e);
        }
    }

    private static Map<String, String> checkValues(CheckOutcome c, String anchor) {
        Map<String, String> v = new HashMap<>();
        v.put("anchor", anchor);
        v.put("name", c.name());
        v.put("kind", c.kind() == null ? "" : c.kind());
        v.put("verdict", c.passed() ? "pass" : "fail");
        v.put("verdict_word", c.passed() ? "pass" : "fail");
        v.put("measured", c.measured() == null ? "" : c.measured());
        v.put("required", c.required() == null ? "" : c.required());
        v.put("message", c.message() == null ? "" : c.message());
        return v;
    }

    private static String checkPlot(String id, CheckOutcome c, DecimatedTraces.Trace t, double[] range, boolean zoomed, Recording rec) {
        if (c.signal() == null) {
            return zoomed ? Template.of("empty-note.html").render(Map.of("text", "This check names no signal to plot.")) : "";
        }
        if (rec.reader == null) {
            return "";
        }
        if (t == null && zoomed) {
            return Template.of("empty-note.html").render(Map.of("text", "No judged window to zoom on; the whole run is shown below."));
        }
        if (t == null || t.size() == 0) {
            return Template.of("empty-note.html").render(Map.of("text", "Signal " + c.signal() + " is not in the recording."));
        }
        SvgLinePlot p = new SvgLinePlot(1080, zoomed ? 300 : 150).id(id)
                .title(zoomed ? c.signal() + " around the judged window" : c.signal() + " over the whole run")
                .xAxis("plant time", "s").yAxis(c.signal(), t.unit());
        if (range != null) {
            p.xRange(range[0], range[1]);
        } else {
            p.xRange(0.0, rec.endS > 0 ? rec.endS : 1.0);
        }
        boolean hasBand = Double.isFinite(c.bandLow()) || Double.isFinite(c.bandHigh());
        if (hasBand) {
            p.addBand(c.windowStartS(), c.windowEndS(), c.bandLow(), c.bandHigh(), "required: " + c.required());
        }
        p.addSeries(c.signal(), t.timeS(), t.value());
        p.addMarker(c.windowStartS(), zoomed ? "window start" : "");
        p.addMarker(c.windowEndS(), zoomed ? "end" : "");
        return p.toSvgElement();
    }

    private static String timingRow(String name, Histogram h) {
        Map<String, String> v = new HashMap<>();
        v.put("name", name);
        if (h == null || h.getTotalCount() == 0) {
            v.put("count", "-");
            for (String k : SummaryJson.PERCENTILE_KEYS) {
                v.put(k, "-");
            }
            v.put("max", "-");
        } else {
            v.put("count", String.format(Locale.ROOT, "%,d", h.getTotalCount()));
            for (int i = 0; i < SummaryJson.PERCENTILES.length; i++) {
                v.put(SummaryJson.PERCENTILE_KEYS[i], micros(h.getValueAtPercentile(SummaryJson.PERCENTILES[i])));
            }
            v.put("max", micros(h.getMaxValue()));
        }
        return Template.of("timing-row.html").render(v);
    }

    /** Duration in ns shown in the unit that fits: ns, µs or ms. */
    static String micros(long ns) {
        if (ns < 1_000) {
            return ns + " ns";
        }
        if (ns < 10_000_000) {
            return fixed(ns / 1000.0, ns < 100_000 ? 2 : 1) + " µs";
        }
        return fixed(ns / 1e6, 2) + " ms";
    }

    /** A log-log histogram: bars for power-of-two buckets from 1 µs, markers at p50, p99, p99.9 and max. */
    private static String histogram(String id, String name, Histogram h) {
        if (h == null || h.getTotalCount() == 0) {
            return Template.of("empty-note.html").render(Map.of("text", name + ": not measured in this run."));
        }
        List<double[]> bars = new ArrayList<>();
        double from = 0.0;
        long firstBucketNs = Math.max(1, Math.min(1000, h.getMinValue()));
        for (HistogramIterationValue v : h.logarithmicBucketValues(firstBucketNs, 2.0)) {
            double to = v.getValueIteratedTo() / 1000.0;
            long count = v.getCountAddedInThisIterationStep();
            if (count > 0) {
                bars.add(new double[] {Math.max(from, firstBucketNs / 2000.0), to, count});
            }
            from = to;
        }
        double[] left = new double[bars.size()];
        double[] right = new double[bars.size()];
        double[] counts = new double[bars.size()];
        for (int i = 0; i < bars.size(); i++) {
            left[i] = bars.get(i)[0];
            right[i] = bars.get(i)[1];
            counts[i] = bars.get(i)[2];
        }
        SvgLinePlot p = new SvgLinePlot(360, 220).id(id).title(name).xAxis("time", "µs").yAxis("count", "")
                .logX(true).logY(true).addBars(name, left, right, counts);
        p.addMarker(h.getValueAtPercentile(50.0) / 1000.0, "p50");
        p.addMarker(h.getValueAtPercentile(99.0) / 1000.0, "p99");
        p.addMarker(h.getValueAtPercentile(99.9) / 1000.0, "p99.9");
        p.addMarker(h.getMaxValue() / 1000.0, "max");
        return "<div class=\"plot\">" + p.toSvgElement() + "</div>";
    }

    private static String linkTable(LinkCounters l) {
        if (l == null) {
            return Template.of("empty-note.html").render(Map.of("text", "No board link in this run (offline run with the in-process controller)."));
        }
        Map<String, Long> counters = new LinkedHashMap<>();
        counters.put("frames sent", l.framesSent);
        counters.put("replies accepted", l.repliesAccepted);
        counters.put("CRC errors", l.crcErrors);
        counters.put("malformed frames", l.malformedFrames);
        counters.put("late replies", l.lateReplies);
        counters.put("stale replies", l.staleReplies);
        counters.put("duplicate replies", l.duplicateReplies);
        counters.put("missing replies", l.missingReplies);
        counters.put("invalid references", l.invalidReferences);
        counters.put("send failures", l.sendFailures);
        counters.put("watchdog trips", l.watchdogTrips);
        StringBuilder rows = new StringBuilder();
        int i = 0;
        for (Map.Entry<String, Long> e : counters.entrySet()) {
            boolean fault = i++ >= 2 && e.getValue() > 0;
            rows.append(Template.of("kv-row.html").render(Map.of("key", e.getKey(),
                    "value", String.format(Locale.ROOT, "%,d", e.getValue()), "row_class", fault ? "nonzero" : "")));
        }
        return Template.of("link-table.html").render(Map.of("rows", rows.toString()));
    }

    private static String environmentRows(RunReportInput in) {
        Map<String, String> env = new LinkedHashMap<>();
        env.put("plant step h", trim(in.stepPeriodNs() / 1000.0) + " µs");
        env.put("exchange every M steps", in.exchangeEverySteps() + " (one exchange every "
                + trim(in.stepPeriodNs() * (double) in.exchangeEverySteps() / 1000.0) + " µs)");
        env.putAll(in.environment());
        Map<String, Object> loop = in.loopSummary();
        if (loop != null) {
            for (String k : List.of("stop", "stop_detail", "real_time", "wall_time_s", "skipped_exchanges", "samples_missed",
                    "clamped_timing_values")) {
                Object v = loop.get(k);
                if (v != null && !v.toString().isEmpty()) {
                    env.put("loop " + k, v.toString());
                }
            }
        }
        StringBuilder rows = new StringBuilder();
        for (Map.Entry<String, String> e : env.entrySet()) {
            rows.append(Template.of("kv-row.html").render(Map.of("key", e.getKey(),
                    "value", e.getValue() == null ? "" : e.getValue(), "row_class", "")));
        }
        return rows.toString();
    }

    private static String fileRows(Path runDir, RunReportInput in) {
        Map<String, String> files = new LinkedHashMap<>();
        files.put("machine-readable summary", RunReports.SUMMARY_JSON);
        files.put("CI test results", RunReports.JUNIT_XML);
        if (in.comtradeBaseName() != null) {
            files.put("COMTRADE configuration", in.comtradeBaseName() + ".cfg");
            files.put("COMTRADE data (binary)", in.comtradeBaseName() + ".dat");
        }
        if (in.csvFileName() != null) {
            files.put("CSV of chosen signals", in.csvFileName());
        }
        if (in.timingLogFileName() != null) {
            files.put("timing interval log", in.timingLogFileName());
        }
        StringBuilder rows = new StringBuilder();
        for (Map.Entry<String, String> e : files.entrySet()) {
            rows.append(Template.of("file-row.html").render(Map.of("what", e.getKey(), "href", e.getValue(), "file", e.getValue())));
        }
        return rows.toString();
    }

    /** Scaling of every recorded channel, from the .cfg itself: range = b -+ 32767 a, resolution = a. */
    private static String channelTable(Recording rec, RecordingStats stats) {
        if (rec.reader == null) {
            return "";
        }
        ComtradeConfig c = rec.reader.config();
        StringBuilder rows = new StringBuilder();
        for (ComtradeConfig.AnalogChannel ch : c.analogChannels) {
            double low = ch.b() + ch.minCode() * ch.a();
            double high = ch.b() + ch.maxCode() * ch.a();
            // a and b are rounded to 9 digits, so a limit meant as 0 comes out as 1e-9 of the span
            low = Math.abs(low) < ch.a() ? 0.0 : low;
            high = Math.abs(high) < ch.a() ? 0.0 : high;
            Long clamped = stats == null ? null : stats.clampedSamples().get(ch.id());
            rows.append(Template.of("channel-row.html").render(Map.of("id", ch.id(), "unit", ch.unit(),
                    "low", engineering(low), "high", engineering(high), "resolution", engineering(ch.a()),
                    "clamped", stats == null ? "?" : Long.toString(clamped == null ? 0 : clamped))));
        }
        List<String> status = new ArrayList<>();
        for (ComtradeConfig.StatusChannel ch : c.statusChannels) {
            status.add(ch.id());
        }
        String rate = c.stampsCritical || c.sampleRates.isEmpty() ? "time-stamped rate"
                : trim(c.sampleRates.get(c.sampleRates.size() - 1).rateHz()) + " Hz";
        return Template.of("channels.html").render(Map.of("analog_count", Integer.toString(c.analogChannels.size()),
                "status_count", Integer.toString(c.statusChannels.size()),
                "records", String.format(Locale.ROOT, "%,d", c.announcedRecordCount()), "rate", rate,
                "rows", rows.toString(), "status_names", status.isEmpty() ? "none" : String.join(", ", status)));
    }

    /** Four significant digits, plain notation for ordinary magnitudes. */
    static String engineering(double v) {
        if (v == 0) {
            return "0";
        }
        double a = Math.abs(v);
        if (a >= 1e-3 && a < 1e7) {
            return new java.math.BigDecimal(v).round(new java.math.MathContext(4)).stripTrailingZeros().toPlainString();
        }
        return String.format(Locale.ROOT, "%.3e", v);
    }

    private static String notice(String level, String title, String text) {
        return Template.of("notice.html").render(Map.of("level", level, "title", title, "text", text));
    }

    /** Plain decimal without trailing zeros (50.0 -> "50", 12.5 -> "12.5"). */
    static String trim(double v) {
        return new java.math.BigDecimal(fixed(v, 6)).stripTrailingZeros().toPlainString();
    }

    static String fixed(double v, int decimals) {
        return String.format(Locale.ROOT, "%." + decimals + "f", v);
    }

    /** The run's COMTRADE recording, if there is a readable one. */
    private static final class Recording {
        ComtradeReader reader;
        /** Plant time of the last record, s. */
        double endS;
        /** Plant time of the first record, s. */
        double offsetS;
        String problem;

        static Recording open(Path runDir, String baseName, double firstSamplePlantTimeS) {
            Recording r = new Recording();
            r.offsetS = firstSamplePlantTimeS;
            if (baseName == null) {
                r.problem = "This run was not recorded, so no signal can be plotted.";
                return r;
            }
            Path cfg = runDir.resolve(baseName + ".cfg");
            try {
                r.reader = ComtradeReader.open(cfg);
                ComtradeConfig c = r.reader.config();
                long records = c.announcedRecordCount();
                if (!c.stampsCritical && !c.sampleRates.isEmpty() && c.sampleRates.get(0).rateHz() > 0) {
                    r.endS = Math.max(0, records - 1) / c.sampleRates.get(c.sampleRates.size() - 1).rateHz();
                } else {
                    double[] last = {0};
                    r.reader.read((n, t, a, s) -> last[0] = t);
                    r.endS = last[0];
                }
                r.endS += r.offsetS;
                if (r.endS <= r.offsetS) {
                    r.endS = r.offsetS + 1e-3;
                }
            } catch (IOException | IllegalArgumentException e) {
                r.reader = null;
                r.problem = "The recording " + cfg.getFileName() + " could not be read: " + e.getMessage();
            }
            return r;
        }
    }
}
