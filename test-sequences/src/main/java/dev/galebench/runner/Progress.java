package dev.galebench.runner;

import dev.galebench.rt.RealTimeLoop;
import java.io.PrintStream;
import java.util.Locale;

/**
 * The progress bar on stderr while a run goes: plant time done, share of the run and speed
 * against real time, redrawn four times a second on a terminal (carriage return), or one line
 * per quarter of the run when stderr is not a terminal (CI logs). Reads the loop's counters from
 * its own daemon thread; never touches the real-time thread.
 */
final class Progress implements AutoCloseable {
    private final PrintStream err;
    private final RealTimeLoop loop;
    private final String name;
    private final long totalSteps;
    private final long stepPeriodNs;
    private final boolean terminal;
    private final Thread thread;
    private volatile boolean stop;
    private final long wallStartNs = System.nanoTime();
    private int lastQuarter = -1;

    Progress(PrintStream err, RealTimeLoop loop, String name, long totalSteps, long stepPeriodNs, boolean terminal) {
        this.err = err;
        this.loop = loop;
        this.name = name;
        this.totalSteps = totalSteps;
        this.stepPeriodNs = stepPeriodNs;
        this.terminal = terminal;
        this.thread = new Thread(this::draw, "galebench-progress");
        thread.setDaemon(true);
        thread.start();
    }

    private void draw() {
        while (!stop) {
            try {
                Thread.sleep(250);
            } catch (InterruptedException e) {
                return;
            }
            show(loop.timings().snapshot().steps(), false);
        }
    }

    String line(long steps) {
        final double frac = totalSteps == 0 ? 1 : Math.min(1.0, (double) steps / totalSteps);
        final int width = 30, filled = (int) Math.round(frac * width);
        final double plantS = steps * stepPeriodNs * 1e-9;
        final double wallS = (System.nanoTime() - wallStartNs) * 1e-9;
        return String.format(Locale.ROOT, "%s [%s%s] %3.0f %%  %.2f / %.2f s plant  (%.2fx real time)", name,
                "#".repeat(filled), "-".repeat(width - filled), frac * 100, plantS, totalSteps * stepPeriodNs * 1e-9,
                wallS > 0 ? plantS / wallS : 0.0);
    }

    private synchronized void show(long steps, boolean last) {
        if (terminal) {
            err.print("\r" + line(steps) + (last ? "\n" : ""));
            err.flush();
            return;
        }
        final int quarter = totalSteps == 0 ? 4 : (int) Math.min(4, 4 * steps / totalSteps);
        if (quarter > lastQuarter && (quarter > 0 || last)) {
            lastQuarter = quarter;
            err.println(line(steps));
        }
    }

    /** Stops the bar and draws the final state. */
    @Override
    public void close() {
        stop = true;
        thread.interrupt();
        try {
            thread.join(1000);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
        show(loop.timings().snapshot().steps(), true);
    }
}
