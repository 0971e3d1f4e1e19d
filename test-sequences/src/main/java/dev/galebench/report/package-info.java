/**
 * The files of a run folder: {@code summary.json}, {@code junit.xml} and {@code report.html}
 * written at the end of a run by {@link dev.galebench.report.RunReports#writeAll} from a
 * {@link dev.galebench.report.RunReportInput}. Everything here runs off the real-time thread;
 * the waveforms are read back from the run's COMTRADE recording, decimated, so the reports
 * cost the same memory for a 10-second and a 10-minute run. Formats: test-sequences/REPORTS.md.
 */
package dev.galebench.report;
