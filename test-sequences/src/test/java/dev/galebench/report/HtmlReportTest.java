package dev.galebench.report;

import dev.galebench.testsupport.DemoRun;
import dev.galebench.testsupport.RunInputs;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.Paths;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

class HtmlReportTest {
    static int count(String text, String needle) {
        int n = 0;
        for (int i = text.indexOf(needle); i >= 0; i = text.indexOf(needle, i + 1)) {
            n++;
        }
        return n;
    }

    static int maxPathPoints(String html) {
        Matcher m = Pattern.compile(" d=\"([^\"]*)\"").matcher(html);
        int max = 0;
        while (m.find()) {
            max = Math.max(max, count(m.group(1), "L") + 1);
        }
        return max;
    }

    @Test
    void shouldWriteASelfContainedPageWithVerdictsPlotsTimingLinkAndEnvironment(@TempDir Path dir) throws Exception {
        Path out = Boolean.getBoolean("galebench.keepReport") ? Files.createDirectories(Paths.get("target/demo-run")) : dir;
        DemoRun.writeFolder(out, 3.0);
        String html = Files.readString(out.resolve("report.html"), StandardCharsets.UTF_8);

        // self-contained: nothing fetched from elsewhere, no script
        assertFalse(html.contains("<script"), "script in page");
        assertFalse(html.contains("<link"), "external stylesheet");
        assertFalse(html.contains("src="), "external image or frame");
        assertFalse(html.contains("@import") || html.contains("@font-face"), "external font or css");
        assertFalse(Pattern.compile("https?://").matcher(html).find(), "absolute URL in page");
        assertFalse(html.contains("{{"), "unfilled placeholder");

        // verdict table: one row per check, names escaped
        for (var c : DemoRun.checks()) {
            assertTrue(html.contains(">" + c.name() + "</a>"), c.name());
        }
        assertTrue(html.contains("too late &lt;&amp;&gt;."), "message not escaped");
        assertEquals(1, count(html, "class=\"run-header verdict-fail\""));
        // a zoom and a whole-run plot per check with a signal, 3 signal plots, 3 histograms
        assertEquals(3 * 2 + 3 + 3, count(html, "<svg "));
        assertEquals(2 * 3, count(html, "class=\"gb-band\""), "band on zoom and whole-run plot of each check with limits");
        assertTrue(maxPathPoints(html) <= 2 * HtmlReport.BUCKETS_PER_PLOT, "points " + maxPathPoints(html));
        assertTrue(maxPathPoints(html) > 100, "plots look empty: " + maxPathPoints(html));
        // timing, link and environment panels
        assertTrue(html.contains("<th>Lateness</th>"));
        Matcher late = Pattern.compile("<th>Lateness</th><td>1,000</td><td>([0-9.]+) µs</td>").matcher(html);
        assertTrue(late.find(), "lateness row");
        assertEquals(500.0, Double.parseDouble(late.group(1)), 1.0, "lateness p50 of 1..1000 us");
        assertTrue(html.contains("<tr class=\"nonzero\"><th>CRC errors</th><td class=\"mono\">3</td></tr>"));
        assertTrue(html.contains("<th>jvm_flags</th>"));
        assertTrue(html.contains("href=\"recording.cfg\""));
        assertTrue(html.contains("href=\"timing.hlog\""));
        // the demo's 10 samples beyond the current range are reported, not hidden
        assertTrue(html.contains("10 samples were outside their channel&#39;s range") && html.contains("i_grid_a_a: 10"),
                "clamp notice");
        // channel table from the .cfg: the current channel spans +-1.5 x 5200 A with 0.238 A steps, 10 clamped
        assertTrue(html.contains("<tr><td class=\"mono\">i_grid_a_a</td><td>A</td><td class=\"num\">-7800</td>"
                + "<td class=\"num\">7800</td><td class=\"num\">0.238</td><td class=\"num\">10</td></tr>"), "channel row");
        // the other two files exist too
        assertTrue(Files.size(out.resolve("summary.json")) > 0);
        assertTrue(Files.size(out.resolve("junit.xml")) > 0);
    }

    @Test
    void shouldKeepThePageSizeIndependentOfTheRunLength(@TempDir Path dir) throws Exception {
        Path shortRun = Files.createDirectory(dir.resolve("short"));
        Path longRun = Files.createDirectory(dir.resolve("long"));
        DemoRun.writeFolder(shortRun, 2.0);
        DemoRun.writeFolder(longRun, 30.0); // 600 000 records
        long a = Files.size(shortRun.resolve("report.html"));
        long b = Files.size(longRun.resolve("report.html"));
        assertTrue(b < 1.5 * a, "page grew with the run: " + a + " -> " + b + " bytes");
        assertTrue(b < 1_500_000, "page too large: " + b);
    }

    @Test
    void shouldSayWhyThereAreNoWaveformsAndShowAnAbortedRun(@TempDir Path dir) throws Exception {
        RunReportInput in = RunInputs.failing().comtradeBaseName("missing").abortedReason("board silent for 20 ms").samplesDropped(5)
                .link(null).roundTripNs(null).checks(List.of(RunInputs.passedDcBand())).build();
        RunReports.writeAll(dir, in);
        String html = Files.readString(dir.resolve("report.html"));
        assertTrue(html.contains("notice-error"));
        assertTrue(html.contains("board silent for 20 ms"));
        assertTrue(html.contains("5 samples were missed"));
        assertTrue(html.contains("The recording missing.cfg could not be read"));
        assertTrue(html.contains("No board link in this run"));
        assertTrue(html.contains("Round trip: not measured in this run."));
    }
}
