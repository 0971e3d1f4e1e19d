package dev.galebench.e2e.dashboard;

import org.openqa.selenium.OutputType;
import org.openqa.selenium.WebDriver;
import org.openqa.selenium.chrome.ChromeDriver;
import org.openqa.selenium.chrome.ChromeDriverService;
import org.openqa.selenium.chrome.ChromeOptions;

import java.io.File;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.Comparator;
import java.util.stream.Stream;

/**
 * A real headless Chromium driven through Debian's chromedriver. The driver path is given
 * explicitly, so Selenium Manager never runs and nothing is downloaded; each browser gets a
 * fresh profile directory, deleted on close.
 */
final class HeadlessChromium implements AutoCloseable {
    static final String CHROMIUM = "/usr/bin/chromium";
    static final String CHROMEDRIVER = "/usr/bin/chromedriver";

    private final Path profile;
    private final ChromeDriverService service;
    private final ChromeDriver driver;

    HeadlessChromium(int widthPx, int heightPx) {
        this(widthPx, heightPx, null);
    }

    /**
     * @param cpuList null, or the CPUs (kernel list, e.g. "1-3") the driver and the browser it
     *                starts may use: started through {@code taskset -c}, which their children
     *                inherit. Keeps a browser on this host off the loop's core, as
     *                {@code isolcpus} would on a bench PC.
     */
    HeadlessChromium(int widthPx, int heightPx, String cpuList) {
        try {
            profile = Files.createTempDirectory("galebench-chromium");
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        File driverExecutable = new File(CHROMEDRIVER);
        if (cpuList != null) {
            if (!cpuList.matches("[0-9]+([-,][0-9]+)*")) {
                throw new IllegalArgumentException("not a CPU list: " + cpuList);
            }
            Path wrapper = profile.resolve("chromedriver-on-cpus-" + cpuList.replace(',', '_'));
            try {
                Files.writeString(wrapper, "#!/bin/sh\nexec /usr/bin/taskset -c " + cpuList + " " + CHROMEDRIVER + " \"$@\"\n");
            } catch (IOException e) {
                throw new UncheckedIOException(e);
            }
            if (!wrapper.toFile().setExecutable(true)) {
                throw new IllegalStateException("cannot make " + wrapper + " executable");
            }
            driverExecutable = wrapper.toFile();
        }
        service = new ChromeDriverService.Builder()
                .usingDriverExecutable(driverExecutable)
                .usingAnyFreePort()
                .build();
        ChromeOptions o = new ChromeOptions();
        o.setBinary(CHROMIUM);
        // --disable-software-rasterizer: without a GPU, Chromium's GPU process starts a software
        // renderer whose worker threads each pin themselves to one CPU (sched_setaffinity), the
        // loop's included, whatever taskset the browser was started under (seen in
        // /proc/PID/task/*/status). The console draws on a 2D canvas and needs none of it.
        o.addArguments("--headless=new", "--no-sandbox", "--disable-gpu", "--disable-software-rasterizer", "--disable-dev-shm-usage",
                "--disable-background-networking", "--disable-component-update", "--disable-sync",
                "--no-first-run", "--user-data-dir=" + profile, "--window-size=" + widthPx + "," + heightPx);
        driver = new ChromeDriver(service, o);
        driver.manage().timeouts().pageLoadTimeout(Duration.ofSeconds(30));
    }

    /** True if Debian's chromium and chromedriver are installed (CI installs them). */
    static boolean available() {
        return new File(CHROMIUM).canExecute() && new File(CHROMEDRIVER).canExecute();
    }

    WebDriver driver() {
        return driver;
    }

    /** Saves a PNG of the current page to {@code file} (directories created). */
    Path screenshot(Path file) throws IOException {
        Files.createDirectories(file.getParent());
        Files.write(file, driver.getScreenshotAs(OutputType.BYTES));
        return file;
    }

    @Override
    public void close() {
        try {
            driver.quit();
        } finally {
            service.stop();
            try (Stream<Path> s = Files.walk(profile)) {
                s.sorted(Comparator.reverseOrder()).forEach(p -> p.toFile().delete());
            } catch (IOException ignored) {
                // a leftover temp profile is harmless
            }
        }
    }
}
