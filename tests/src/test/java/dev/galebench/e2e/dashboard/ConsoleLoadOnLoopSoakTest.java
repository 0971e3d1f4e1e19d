package dev.galebench.e2e.dashboard;

import dev.galebench.dashboard.Dashboard;
import dev.galebench.dashboard.DashboardOptions;
import dev.galebench.dashboard.TimingSource;
import dev.galebench.rt.LoopConfig;
import dev.galebench.rt.LoopResult;
import dev.galebench.rt.RealTimeLoop;
import dev.galebench.rt.SampleConsumer;
import dev.galebench.rt.SampleLayout;
import dev.galebench.board.BoardControllers;
import dev.galebench.cli.serve.ServeBench;
import dev.galebench.link.BoardLinks;
import dev.galebench.plant.SteadyState;
import dev.galebench.plant.TurbineFile;
import dev.galebench.plant.TurbineParameters;
import dev.galebench.plant.TurbinePlant;
import dev.galebench.rt.BoardLink;
import org.junit.jupiter.api.Assumptions;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.openqa.selenium.By;
import org.openqa.selenium.support.ui.WebDriverWait;

import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * Measures what two open consoles cost the real-time loop: the same real-time run (the
 * built-in turbine from its steady state at 10 m/s, 50 us step, the in-process virtual board as
 * {@code galebench serve} runs it) alternately without a console and with a console plus two headless
 * Chromium windows drawing it, and compares lateness percentiles in the same session. This is a
 * measurement, not a pass/fail on time: it asserts only outcomes (every exchange done, browsers
 * received data) and writes the numbers to {@code target/console-load.txt}; the result is
 * recorded in {@code dashboard/README.md}.
 *
 * <p>The bench is set up as rt-plant/LOOP.md recommends: the loop thread pinned to one CPU
 * ({@code galebench.load.pinCpu}, default 0; -1 = no pinning), the JVM's other threads (console,
 * feed, JIT, GC) moved off it by the loop, and the browsers started off it too (through
 * {@code taskset}, as {@code isolcpus} would keep them off on a bench PC). With
 * {@code -Dgalebench.load.pinCpu=-1} everything shares every core, the setup to avoid.
 *
 * <p>Run: {@code mvn -B -P soak verify -pl tests -am -Dtest=ConsoleLoadOnLoopSoakTest
 * -Dsurefire.failIfNoSpecifiedTests=false} (system properties {@code galebench.load.rounds},
 * default 5, and {@code galebench.load.seconds}, default 20).
 */
@Tag("soak")
class ConsoleLoadOnLoopSoakTest {
    static {
        // Disruptor's single-producer assertion takes a monitor on the publishing thread.
        ClassLoader.getSystemClassLoader().setPackageAssertionStatus("com.lmax.disruptor", false);
    }

    private final StringBuilder consoleCpu = new StringBuilder();
    private static final long STEP_NS = Math.round(Double.parseDouble(System.getProperty("galebench.load.stepUs", "50")) * 1000);
    private static final int PIN_CPU = Integer.getInteger("galebench.load.pinCpu",
            Runtime.getRuntime().availableProcessors() >= 2 ? 0 : -1);

    /** The CPUs other than the loop's (kernel list), or null when the loop is not pinned. */
    private static String otherCpus() {
        if (PIN_CPU < 0) {
            return null;
        }
        StringBuilder sb = new StringBuilder();
        for (int c = 0; c < Runtime.getRuntime().availableProcessors(); c++) {
            if (c != PIN_CPU) {
                sb.append(sb.length() == 0 ? "" : ",").append(c);
            }
        }
        return sb.length() == 0 ? null : sb.toString();
    }

    @Test
    void shouldMeasureLoopLatenessWithAndWithoutTwoOpenConsoles() throws Exception {
        Assumptions.assumeTrue(HeadlessChromium.available(), "needs /usr/bin/chromium and /usr/bin/chromedriver");
        int rounds = Integer.getInteger("galebench.load.rounds", 5);
        int seconds = Integer.getInteger("galebench.load.seconds", 20);
        List<double[]> without = new ArrayList<>();
        List<double[]> sockets = new ArrayList<>();
        List<double[]> with = new ArrayList<>();
        StringBuilder report = new StringBuilder();
        report.append(String.format(Locale.ROOT, "# load average at start %.2f (2 cores)%n",
                java.lang.management.ManagementFactory.getOperatingSystemMXBean().getSystemLoadAverage()));
        report.append(String.format(Locale.ROOT, "# %d rounds of %d s each, step %d us, %s%n", rounds, seconds, STEP_NS / 1000,
                "columns: p50 p99 p99.9 max lateness (us), overruns"));
        report.append(PIN_CPU < 0 ? "# loop not pinned; browsers on any CPU\n"
                : String.format(Locale.ROOT, "# loop pinned to CPU %d, the JVM's other threads and the browsers on CPUs %s%n", PIN_CPU, otherCpus()));
        runLoop(seconds / 4, null); // warm-up: JIT, caches
        for (int r = 0; r < rounds; r++) {
            double[] a = runLoop(seconds, null);
            without.add(a);
            report.append(line("without", a));
            double[] c = runWithTwoSocketViewers(seconds);
            sockets.add(c);
            report.append(line("2 socket viewers", c));
            double[] b = runWithTwoConsoles(seconds);
            with.add(b);
            report.append(line("with 2 consoles", b));
        }
        report.append(String.format(Locale.ROOT, "median p99.9 with 2 socket viewers (browsers elsewhere) %.2f us, ratio %.3f%n",
                median(sockets, 2), median(sockets, 2) / median(without, 2)));
        report.append(String.format(Locale.ROOT, "median p99 with 2 socket viewers %.2f us, ratio %.3f%n",
                median(sockets, 1), median(sockets, 1) / median(without, 1)));
        double p999Without = median(without, 2);
        double p999With = median(with, 2);
        double p99Without = median(without, 1);
        double p99With = median(with, 1);
        report.append(String.format(Locale.ROOT, "median p99 without %.2f us, with %.2f us, ratio %.3f%n",
                p99Without, p99With, p99With / p99Without));
        report.append(String.format(Locale.ROOT, "median p99.9 without %.2f us, with %.2f us, ratio %.3f%n",
                p999Without, p999With, p999With / p999Without));
        report.append(consoleCpu);
        Path out = Path.of("target", "console-load.txt");
        Files.createDirectories(out.getParent());
        Files.writeString(out, report);
        System.out.print(report);
    }

    private double[] runWithTwoConsoles(int seconds) throws Exception {
        try (Dashboard d = Dashboard.start(DashboardOptions.loopback(0), null, null);
             HeadlessChromium one = new HeadlessChromium(1600, 1000, otherCpus());
             HeadlessChromium two = new HeadlessChromium(1600, 1000, otherCpus())) {
            one.driver().get(d.url());
            two.driver().get(d.url());
            awaitViewers(d, 2);
            Thread netty = null;
            for (Thread t : Thread.getAllStackTraces().keySet()) {
                if (t.getName().startsWith("galebench-dashboard-") && !t.getName().endsWith("control")) {
                    netty = t;
                }
            }
            java.lang.management.ThreadMXBean mx = java.lang.management.ManagementFactory.getThreadMXBean();
            long nettyCpu0 = netty == null ? 0 : mx.getThreadCpuTime(netty.getId());
            double[] r = runLoop(seconds, d);
            long nettyCpuNs = netty == null ? -1 : mx.getThreadCpuTime(netty.getId()) - nettyCpu0;
            consoleCpu.append(String.format(Locale.ROOT, "console CPU in a %d s run: feed thread %.1f ms, network thread %.1f ms%n",
                    seconds, d.feedCpuNs() / 1e6, nettyCpuNs / 1e6));
            for (HeadlessChromium c : List.of(one, two)) {
                // the page drew the stream: the lateness panel has a plot and a p99.9 value
                new WebDriverWait(c.driver(), Duration.ofSeconds(10)).until(drv ->
                        !drv.findElements(By.cssSelector("#plot-late .uplot")).isEmpty()
                                && drv.findElement(By.id("timing-kv")).getText().contains("lateness p99.9"));
            }
            assertEquals(0, d.slowViewerSkips(), "both consoles kept up");
            return r;
        }
    }

    /**
     * The server side of two open consoles whose browsers run on another machine: two real
     * WebSocket clients (JDK) receive every message; the console does all its work (decimation,
     * encoding, two sockets), nothing draws on this host.
     */
    private double[] runWithTwoSocketViewers(int seconds) throws Exception {
        try (Dashboard d = Dashboard.start(DashboardOptions.loopback(0), null, null)) {
            java.util.concurrent.atomic.AtomicLong received = new java.util.concurrent.atomic.AtomicLong();
            List<java.net.http.WebSocket> sockets = new ArrayList<>();
            for (int i = 0; i < 2; i++) {
                sockets.add(java.net.http.HttpClient.newHttpClient().newWebSocketBuilder()
                        .buildAsync(java.net.URI.create("ws://127.0.0.1:" + d.port() + "/ws"), new java.net.http.WebSocket.Listener() {
                            @Override
                            public java.util.concurrent.CompletionStage<?> onText(java.net.http.WebSocket ws, CharSequence data, boolean last) {
                                if (last) {
                                    received.incrementAndGet();
                                }
                                ws.request(1);
                                return null;
                            }
                        }).join());
            }
            awaitViewers(d, 2);
            double[] r = runLoop(seconds, d);
            assertTrue(received.get() > seconds * 2L * 5, "the viewers received the stream: " + received.get() + " messages");
            for (java.net.http.WebSocket ws : sockets) {
                ws.abort();
            }
            return r;
        }
    }

    /** Runs the loop for {@code seconds}; returns lateness p50, p99, p99.9, max in us, and overruns. */
    private static double[] runLoop(int seconds, Dashboard d) throws InterruptedException {
        TurbineParameters p = TurbineFile.defaults();
        TurbinePlant plant = new TurbinePlant(p, STEP_NS);
        plant.initialise(SteadyState.solve(p, 10.0, 1.0, 0.0));
        BoardLink link = BoardLinks.inProcess(BoardControllers.create(ServeBench.defaultController()));
        long steps = seconds * 1_000_000_000L / STEP_NS;
        LoopConfig cfg = LoopConfig.builder().stepPeriodNs(STEP_NS).durationSteps(steps).realTime(true).pinCpu(PIN_CPU).build();
        List<SampleConsumer> consumers = d == null ? List.of() : List.of(d.feed());
        RealTimeLoop loop = new RealTimeLoop(cfg, plant, link, null, consumers, SampleLayout.of(plant));
        if (d != null) {
            d.timingSource(TimingSource.of(loop, link));
        }
        LoopResult r = loop.run();
        link.close();
        assertEquals(steps, r.steps, "the run completed");
        assertTrue(PIN_CPU < 0 || r.pinning.startsWith("pinned to CPU " + PIN_CPU), r.pinning);
        assertTrue(r.linkCounters.repliesAccepted > 0);
        return new double[] {
            r.latenessNs.getValueAtPercentile(50) / 1000.0,
            r.latenessNs.getValueAtPercentile(99) / 1000.0,
            r.latenessNs.getValueAtPercentile(99.9) / 1000.0,
            r.latenessNs.getMaxValue() / 1000.0,
            r.overruns};
    }

    private static String line(String what, double[] a) {
        return String.format(Locale.ROOT, "%-16s %8.2f %8.2f %8.2f %10.1f %6.0f%n", what, a[0], a[1], a[2], a[3], a[4]);
    }

    private static double median(List<double[]> runs, int column) {
        double[] v = new double[runs.size()];
        for (int i = 0; i < v.length; i++) {
            v[i] = runs.get(i)[column];
        }
        java.util.Arrays.sort(v);
        return v.length % 2 == 1 ? v[v.length / 2] : (v[v.length / 2 - 1] + v[v.length / 2]) / 2;
    }

    static void awaitViewers(Dashboard d, int n) throws InterruptedException {
        long deadline = System.nanoTime() + 20_000_000_000L;
        while (d.viewerCount() < n) {
            assertTrue(System.nanoTime() < deadline, "expected " + n + " consoles, have " + d.viewerCount());
            Thread.sleep(20);
        }
    }
}
