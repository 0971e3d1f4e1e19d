package dev.galebench.dashboard.support;

import dev.galebench.dashboard.Dashboard;
import dev.galebench.dashboard.DashboardOptions;
import dev.galebench.dashboard.Verdict;
import dev.galebench.rt.Sample;
import dev.galebench.rt.SampleConsumer;

import java.nio.file.Files;
import java.nio.file.Path;

/**
 * Starts a console fed with a synthetic, turbine-like stream (our own numbers, not a plant
 * model) so a developer can look at the page: {@code java ... ConsolePreview PORT SECONDS}.
 * A 150 ms dip to 0.2 pu falls at 4 s of every 10 s; verdicts fall after it.
 */
public final class ConsolePreview {
    private ConsolePreview() {
    }

    public static void main(String[] args) throws Exception {
        int port = args.length > 0 ? Integer.parseInt(args[0]) : 8470;
        double seconds = args.length > 1 ? Double.parseDouble(args[1]) : 60;
        try (Dashboard d = Dashboard.start(DashboardOptions.loopback(port), new RecordingBench(true), into -> {
            into.overruns = 0;
            into.linkPresent = true;
            into.link.framesSent = (long) (System.nanoTime() / 1e6);
            into.link.repliesAccepted = into.link.framesSent - 3;
            into.link.missingReplies = 3;
        })) {
            System.out.println("console at " + d.url());
            Path runDir = Files.createTempDirectory("galebench-preview");
            Files.writeString(runDir.resolve("report.html"), "<!doctype html><title>report</title><h1>preview report</h1>");
            d.sequenceStarted("deep-dip", "preview-1");
            run(d.feed(), seconds, d);
            d.sequenceFinished("deep-dip", "preview-1", "failed", runDir, "report.html");
            Thread.sleep(1000);
        }
    }

    private static void run(SampleConsumer feed, double seconds, Dashboard d) throws InterruptedException {
        String[] names = DashboardOptions.DEFAULT_PLOT_SIGNALS.toArray(new String[0]);
        String[] units = {"V", "A", "A", "A", "A", "W", "var", "m/s", "rad/s", "pu", "pu", "pu", "us", "us"};
        long periodNs = 100_000L; // 10 kHz exchange
        feed.onStart(names, units, periodNs, 1);
        Sample s = new Sample(names.length);
        long t0 = System.nanoTime();
        long n = (long) (seconds * 1e9 / periodNs);
        boolean verdictsSent = false;
        for (long k = 0; k < n; k++) {
            double t = k * periodNs * 1e-9;
            double tc = t % 10.0;
            boolean dip = tc >= 4.0 && tc < 4.15;
            double v = dip ? 0.2 : 1.0 + 0.01 * Math.exp(-(tc - 4.15) * 20) * (tc > 4.15 ? 1 : 0);
            double wind = 10.5 + 0.8 * Math.sin(t * 0.7) + 0.3 * Math.sin(t * 2.3);
            double[] x = s.values;
            x[0] = 1150 + 6 * Math.sin(2 * Math.PI * 300 * t) + (dip ? 90 * Math.min(1, (tc - 4.0) * 30) : 0);
            x[1] = dip ? 300 : 2100 * wind / 11.0;
            x[2] = dip ? -1900 : 40;
            x[3] = -30;
            x[4] = 2300 * wind / 11.0;
            x[5] = x[1] * 690 * 1.5;
            x[6] = x[2] * -690 * 1.5 * v;
            x[7] = wind;
            x[8] = 1.45 + 0.05 * Math.sin(t * 0.5);
            x[9] = v;
            x[10] = dip ? 0.2 : 1.0;
            x[11] = tc > 7 ? 0.03 : 0.0;
            x[12] = 1.2 + 0.6 * Math.abs(Math.sin(k * 0.37)) + (k % 9973 == 0 ? 35 : 0);
            x[13] = 62 + 8 * Math.abs(Math.sin(k * 0.11));
            s.exchangeIndex = k;
            s.stepIndex = k;
            s.plantTimeNs = k * periodNs;
            feed.onSample(s);
            if (!verdictsSent && tc > 5.0) {
                verdictsSent = true;
                d.verdict(new Verdict("reactive-current-rise", "rise_time", true, "18.0 ms", "<= 30 ms",
                        "reactive current reached 90 % in time"), 4.018);
                d.verdict(new Verdict("dc-link-band", "band", true, "1243 V peak", "<= 1300 V", "stayed in band"), 4.6);
                d.verdict(new Verdict("active-power-recovery", "settle", false, "612 ms", "<= 500 ms",
                        "active power took longer than required to return to 90 %"), 4.9);
            }
            if ((k & 63) == 0) {
                long due = t0 + k * periodNs;
                long wait = due - System.nanoTime();
                if (wait > 1_000_000L) {
                    Thread.sleep(wait / 1_000_000L);
                }
            }
        }
        feed.onEnd(0);
    }
}
