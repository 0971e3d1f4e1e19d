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
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * The live console in a real headless Chromium against {@code galebench serve} in its own
 * process: live plots of the real plant appear, a bench control typed into the page reaches
 * the plant (its effect shows in the plot legend) and lands in the session's controls.log.
 * Saves {@code target/dashboard-e2e/console.png}.
 */
class ConsoleInBrowserTest {
    private static final Path ARTIFACTS = Path.of("target", "dashboard-e2e");

    @Test
    void shouldAskForTheTokenAndOfferViewersNoControls() throws Exception {
        Assumptions.assumeTrue(HeadlessChromium.available(), "needs /usr/bin/chromium and /usr/bin/chromedriver");
        Path runs = Files.createTempDirectory("galebench-e2e-runs");
        String token = "bench-token-4711";
        try (ServedBench bench = new ServedBench(runs, "--token", token, "--allow-viewers");
             HeadlessChromium owner = new HeadlessChromium(1400, 900);
             HeadlessChromium visitor = new HeadlessChromium(1400, 900)) {
            // a viewer without the token watches read-only: live, but every control disabled
            WebDriver view = visitor.driver();
            view.get(bench.url());
            WebDriverWait viewWait = new WebDriverWait(view, Duration.ofSeconds(30));
            viewWait.until(d -> "live".equals(d.findElement(By.id("conn-text")).getText()));
            assertEquals("read-only", view.findElement(By.id("role")).getText());
            viewWait.until(d -> !d.findElements(By.cssSelector("#seq-list button[data-sequence]")).isEmpty());
            assertTrue(view.findElements(By.cssSelector("#seq-list button[data-sequence]")).stream().noneMatch(WebElement::isEnabled));
            assertTrue(view.findElements(By.cssSelector("#bench-card button")).stream().noneMatch(WebElement::isEnabled));

            // the owner opens the page with the token in the address and may act
            WebDriver page = owner.driver();
            page.get(bench.url() + "?token=" + token);
            WebDriverWait wait = new WebDriverWait(page, Duration.ofSeconds(30));
            wait.until(d -> "live".equals(d.findElement(By.id("conn-text")).getText()));
            assertEquals("control", page.findElement(By.id("role")).getText());
            WebElement level = page.findElement(By.id("voltage-level"));
            level.clear();
            level.sendKeys("0.5");
            page.findElement(By.cssSelector("#voltage-form button")).click();
            wait.until(d -> d.findElement(By.cssSelector("#log li")).getText().contains("dip: source 0.500 pu"));
            // and the viewer sees the owner's control in its log
            viewWait.until(d -> d.findElement(By.cssSelector("#log li")).getText().contains("dip: source 0.500 pu"));
        }
    }

    @Test
    void shouldPromptForTheTokenWhenTheSocketIsRefused() throws Exception {
        Assumptions.assumeTrue(HeadlessChromium.available(), "needs /usr/bin/chromium and /usr/bin/chromedriver");
        Path runs = Files.createTempDirectory("galebench-e2e-runs");
        String token = "bench-token-0815";
        try (ServedBench bench = new ServedBench(runs, "--token", token);
             HeadlessChromium chromium = new HeadlessChromium(1400, 900)) {
            WebDriver page = chromium.driver();
            page.get(bench.url());
            WebDriverWait wait = new WebDriverWait(page, Duration.ofSeconds(30));
            wait.until(d -> d.findElement(By.id("token-bar")).isDisplayed());
            assertEquals("refused", page.findElement(By.id("conn-text")).getText());
            page.findElement(By.id("token-input")).sendKeys(token);
            page.findElement(By.cssSelector("#token-form button")).click();
            wait.until(d -> "live".equals(d.findElement(By.id("conn-text")).getText()));
            assertEquals("control", page.findElement(By.id("role")).getText());
        }
    }

    @Test
    void shouldShowTheLivePlantAndDriveItFromThePage() throws Exception {
        Assumptions.assumeTrue(HeadlessChromium.available(), "needs /usr/bin/chromium and /usr/bin/chromedriver");
        Path runs = Files.createTempDirectory("galebench-e2e-runs");
        try (ServedBench bench = new ServedBench(runs, "--wind", "9");
             HeadlessChromium chromium = new HeadlessChromium(1600, 1000)) {
            WebDriver page = chromium.driver();
            page.get(bench.url());
            WebDriverWait wait = new WebDriverWait(page, Duration.ofSeconds(30));
            wait.until(d -> "live".equals(d.findElement(By.id("conn-text")).getText()));
            assertEquals("control", page.findElement(By.id("role")).getText());
            // plots of the real plant: the DC-link panel has a uPlot canvas and a value
            wait.until(d -> !d.findElements(By.cssSelector("#plot-dc .uplot canvas")).isEmpty());
            wait.until(d -> d.findElement(By.cssSelector("#plot-wind .legend b")).getText().startsWith("9.0"));
            assertTrue(page.findElements(By.cssSelector("#seq-list li[data-sequence]")).size() >= 10, "the library is listed");

            WebElement wind = page.findElement(By.id("wind-value"));
            wind.clear();
            wind.sendKeys("12.5");
            page.findElement(By.cssSelector("#wind-form button")).click();
            wait.until(d -> d.findElement(By.cssSelector("#log li")).getText().contains("wind 12.50 m/s"));
            wait.until(d -> d.findElement(By.cssSelector("#plot-wind .legend b")).getText().startsWith("12.5"));
            chromium.screenshot(ARTIFACTS.resolve("console.png"));

            int code = bench.stop();
            // SIGTERM ends a JVM with 143 after its shutdown hooks ran; the hook closes the bench first
            assertTrue(code == 0 || code == 143, "exit " + code + ": " + String.join("\n", bench.output()));
            Path log;
            try (Stream<Path> s = Files.list(runs)) {
                log = s.findFirst().orElseThrow().resolve("controls.log");
            }
            List<String> lines = Files.readAllLines(log);
            assertTrue(lines.stream().anyMatch(l -> l.contains("wind 12.50 m/s, applied at plant t =")), lines.toString());
            assertTrue(lines.get(lines.size() - 1).endsWith("session closed"), "stopped cleanly: " + lines);
        }
    }
}
