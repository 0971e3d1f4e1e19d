package dev.galebench.report;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;

/**
 * Writes the end-of-run files of one run folder: {@code report.html}, {@code junit.xml} and
 * {@code summary.json}. The COMTRADE recording and the optional CSV are written during the run
 * by {@link dev.galebench.report.recording.ComtradeRecorder} and
 * {@link dev.galebench.report.recording.CsvRecorder}; {@code timing.hlog} by the loop. The
 * HTML report reads the waveforms back from the COMTRADE files, decimated, so a 10-minute run
 * costs no more memory than a 10-second one.
 */
public final class RunReports {
    public static final String REPORT_HTML = "report.html";
    public static final String JUNIT_XML = "junit.xml";
    public static final String SUMMARY_JSON = "summary.json";

    private RunReports() {
    }

    /**
     * Writes the three files into {@code runDir} (created if missing). The machine-readable
     * files are written first, so CI gets its verdict even if the HTML report fails.
     */
    public static void writeAll(Path runDir, RunReportInput in) throws IOException {
        Files.createDirectories(runDir);
        SummaryJson.write(runDir, in);
        JunitXml.write(runDir, in);
        HtmlReport.write(runDir, in);
    }
}
