/**
 * An independent COMTRADE reader (IEEE C37.111 1991/1999/2013, IEC 60255-24) written from the
 * standard, sharing no code with {@link dev.galebench.report.recording.ComtradeRecorder}, so a
 * round trip through it tests the writer against the standard and not against itself. Also the
 * min/max-decimated read-back the HTML report and back-to-back comparisons plot from.
 */
package dev.galebench.report.comtrade;
