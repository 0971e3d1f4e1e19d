package dev.galebench.dashboard;

import picocli.CommandLine.Option;

import java.io.PrintWriter;

/**
 * The {@code --dashboard[=PORT]} option of {@code run} and {@code demo}, as a picocli mixin, so
 * every command that runs a sequence offers it the same way:
 *
 * <pre>{@code
 * @Mixin DashboardOption dashboard;
 * ...
 * try (Dashboard d = dashboard.startIfAsked(BenchControl.watchOnly(name, loop::abort), timing, out)) {
 *     // d is null when the option was not given; add d.feed() to the ring otherwise
 * }
 * }</pre>
 *
 * Without a value the console listens on {@value DashboardOptions#DEFAULT_PORT}; {@code 0} picks
 * a free port. Always loopback and without a token: a scripted run offers watching and abort
 * only, and a console for other machines is {@code galebench serve --bind ... --token ...}.
 */
public final class DashboardOption {
    @Option(names = "--dashboard", arity = "0..1", paramLabel = "PORT",
            fallbackValue = "" + DashboardOptions.DEFAULT_PORT,
            description = "Open the live web console on 127.0.0.1:PORT while the run goes (default PORT "
                    + DashboardOptions.DEFAULT_PORT + ", 0 = any free port).")
    Integer port;

    /** True if the option was given. */
    public boolean asked() {
        return port != null;
    }

    /** The port asked for, or -1 if the option was not given. */
    public int port() {
        return port == null ? -1 : port;
    }

    /**
     * Starts the console if the option was given and prints its address to {@code out};
     * returns null otherwise (try-with-resources accepts null).
     *
     * @throws IllegalArgumentException if the port is out of range or taken (exit code 2)
     */
    public Dashboard startIfAsked(BenchControl bench, TimingSource timing, PrintWriter out) {
        if (port == null) {
            return null;
        }
        Dashboard d = Dashboard.startForRun(port, bench, timing);
        if (out != null) {
            out.println("live console: " + d.url());
            out.flush();
        }
        return d;
    }
}
