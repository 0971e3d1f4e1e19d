package dev.galebench.e2e.dashboard;

import org.junit.jupiter.api.Assumptions;
import org.junit.jupiter.api.Test;
import org.openqa.selenium.By;
import org.openqa.selenium.WebDriver;
import org.openqa.selenium.WebElement;
import org.openqa.selenium.support.ui.WebDriverWait;

import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.List;
import java.util.stream.Stream;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * The user's path through the console in a real headless Chromium against
 * {@code galebench serve} in its own process: start a library sequence from the page, watch
 * the run state and the verdicts arrive, open the finished report through the console's link.
 * Saves {@code target/dashboard-e2e/sequence-verdicts.png} and {@code .../report.png}.
 */
class SequenceFromBrowserTest {
    private static final Path ARTIFACTS = Path.of("target", "dashboard-e2e");
    /** A short library sequence (3 s of plant time). */
    private static final String SEQUENCE = "dip-3ph-deep";

    @Test
    void shouldStartASequenceWatchItsVerdictsAndOpenTheReport() throws Exception {
        Assumptions.assumeTrue(HeadlessChromium.available(), "needs /usr/bin/chromium and /usr/bin/chromedriver");
        Path runs = Files.createTempDirectory("galebench-e2e-runs");
        try (ServedBench bench = new ServedBench(runs);
             HeadlessChromium chromium = new HeadlessChromium(1600, 1000)) {
            WebDriver page = chromium.driver();
            page.get(bench.url());
            WebDriverWait wait = new WebDriverWait(page, Duration.ofSeconds(30));
            wait.until(d -> "live".equals(d.findElement(By.id("conn-text")).getText()));
            WebElement start = wait.until(d -> d.findElement(By.cssSelector("#seq-list button[data-sequence='" + SEQUENCE + "']")));
            wait.until(d -> start.isEnabled());
            start.click();

            WebDriverWait slow = new WebDriverWait(page, Duration.ofSeconds(120));
            slow.until(d -> "running".equals(d.findElement(By.id("run-state")).getText().toLowerCase()));
            assertEquals(SEQUENCE, page.findElement(By.id("run-sequence")).getText());
            assertTrue(page.findElement(By.id("abort")).isEnabled(), "abort is offered while the sequence runs");
            slow.until(d -> {
                String s = d.findElement(By.id("run-state")).getText().toLowerCase();
                return s.equals("passed") || s.equals("failed") || s.equals("aborted");
            });
            List<WebElement> verdicts = page.findElements(By.cssSelector("#verdicts li[data-passed]"));
            assertFalse(verdicts.isEmpty(), "verdicts are shown");
            String state = page.findElement(By.id("run-state")).getText().toLowerCase();
            boolean allPassed = verdicts.stream().allMatch(v -> "true".equals(v.getAttribute("data-passed")));
            if (!state.equals("aborted")) {
                assertEquals(allPassed ? "passed" : "failed", state, "the run state agrees with the verdicts");
            }
            assertTrue(page.findElement(By.id("verdict-tally")).getText().endsWith(verdicts.size() + " passed"));
            chromium.screenshot(ARTIFACTS.resolve("sequence-verdicts.png"));

            WebElement report = page.findElement(By.id("report-link"));
            assertTrue(report.isDisplayed());
            String href = report.getAttribute("href");
            assertTrue(href.contains("/runs/run-1/report.html"), href);
            page.get(href);
            wait.until(d -> d.getPageSource().contains(SEQUENCE));
            chromium.screenshot(ARTIFACTS.resolve("report.png"));

            bench.stop();
            Path session;
            try (Stream<Path> s = Files.list(runs)) {
                session = s.findFirst().orElseThrow();
            }
            try (Stream<Path> s = Files.list(session)) {
                assertTrue(s.anyMatch(p -> p.getFileName().toString().startsWith(SEQUENCE)
                        && Files.isRegularFile(p.resolve("report.html"))), "the run folder is under the session folder");
            }
            String log = Files.readString(session.resolve("controls.log"));
            assertTrue(log.contains("start " + SEQUENCE + " requested from the console"), log);
            assertTrue(log.contains("sequence " + SEQUENCE + " started"), log);
        }
    }
}
