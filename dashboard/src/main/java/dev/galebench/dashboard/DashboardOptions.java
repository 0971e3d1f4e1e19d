package dev.galebench.dashboard;

import java.net.InetAddress;
import java.net.UnknownHostException;
import java.util.List;
import java.util.Objects;

/**
 * Where the console listens and who may use it. Validated once, in {@link #validated()}:
 *
 * <ul>
 *   <li>the port is 0 (any free port) to 65535;</li>
 *   <li>an address other than loopback requires a control token: a console on a network
 *       interface without one would let anyone on that network drive the bench;</li>
 *   <li>a token has at least 8 characters and no whitespace or control characters;</li>
 *   <li>{@code allowViewers} needs a token (without one everybody already has full access).</li>
 * </ul>
 *
 * <table>
 *   <caption>Settings</caption>
 *   <tr><th>setting</th><th>unit</th><th>default</th><th>meaning</th></tr>
 *   <tr><td>bindAddress</td><td>-</td><td>127.0.0.1</td><td>address to listen on</td></tr>
 *   <tr><td>port</td><td>1</td><td>8470</td><td>TCP port; 0 picks a free one</td></tr>
 *   <tr><td>token</td><td>-</td><td>none</td><td>control token; when set, every control request must carry it, on loopback too</td></tr>
 *   <tr><td>allowViewers</td><td>-</td><td>false</td><td>with a token: clients without it may watch (read-only)</td></tr>
 *   <tr><td>plotSignals</td><td>-</td><td>{@link #DEFAULT_PLOT_SIGNALS}</td><td>signals the feed decimates and sends</td></tr>
 *   <tr><td>bucketNs</td><td>ns</td><td>20 000 000</td><td>plant time reduced to one min/max pair</td></tr>
 * </table>
 *
 * @param bindAddress  address to listen on
 * @param port         TCP port, 0 = any free port
 * @param token        control token or null
 * @param allowViewers let clients without the token watch
 * @param plotSignals  signal names to decimate (missing ones are skipped at run start)
 * @param bucketNs     decimation bucket, ns of plant time
 */
public record DashboardOptions(String bindAddress, int port, String token, boolean allowViewers,
                               List<String> plotSignals, long bucketNs) {
    /** Default TCP port of the console. */
    public static final int DEFAULT_PORT = 8470;
    /** Default decimation bucket: 20 ms of plant time, 50 points per second per signal. */
    public static final long DEFAULT_BUCKET_NS = 20_000_000L;
    /** Signals plotted by default (names from the shared signal list). */
    public static final List<String> DEFAULT_PLOT_SIGNALS = List.of(
            "v_dc_v",
            "i_grid_d_a", "i_grid_q_a", "i_stator_d_a", "i_stator_q_a",
            "p_grid_w", "q_grid_var",
            "wind_m_s", "rotor_speed_rad_s",
            "v_term_pu", "v_source_pu", "v_dev_ref_pu",
            "lateness_us", "rtt_us");

    public DashboardOptions {
        Objects.requireNonNull(bindAddress, "bindAddress");
        plotSignals = List.copyOf(plotSignals);
    }

    /** Loopback, given port, no token: what {@code run --dashboard=PORT} uses. */
    public static DashboardOptions loopback(int port) {
        return new DashboardOptions("127.0.0.1", port, null, false, DEFAULT_PLOT_SIGNALS, DEFAULT_BUCKET_NS);
    }

    /** Same options with another port. */
    public DashboardOptions withPort(int newPort) {
        return new DashboardOptions(bindAddress, newPort, token, allowViewers, plotSignals, bucketNs);
    }

    /** Same options with a control token (null removes it). */
    public DashboardOptions withToken(String newToken, boolean viewersAllowed) {
        return new DashboardOptions(bindAddress, port, newToken, viewersAllowed, plotSignals, bucketNs);
    }

    /** Same options on another address. */
    public DashboardOptions withBindAddress(String address) {
        return new DashboardOptions(address, port, token, allowViewers, plotSignals, bucketNs);
    }

    /** True if the bind address is a loopback address. */
    public boolean loopbackOnly() {
        try {
            return InetAddress.getByName(bindAddress).isLoopbackAddress();
        } catch (UnknownHostException e) {
            return false;
        }
    }

    /**
     * Checks every rule in the class comment; returns this.
     *
     * @throws IllegalArgumentException naming the option and the problem
     */
    public DashboardOptions validated() {
        if (port < 0 || port > 65535) {
            throw new IllegalArgumentException("dashboard port " + port + " is outside 0..65535");
        }
        try {
            InetAddress.getByName(bindAddress);
        } catch (UnknownHostException e) {
            throw new IllegalArgumentException("dashboard bind address '" + bindAddress + "' is not a known host");
        }
        if (token != null) {
            if (token.length() < 8) {
                throw new IllegalArgumentException("--token must have at least 8 characters");
            }
            for (int i = 0; i < token.length(); i++) {
                char c = token.charAt(i);
                if (c <= ' ' || c == 127) {
                    throw new IllegalArgumentException("--token must not contain spaces or control characters");
                }
            }
        }
        if (token == null && !loopbackOnly()) {
            throw new IllegalArgumentException("binding the dashboard to " + bindAddress
                    + " (not loopback) requires --token");
        }
        if (allowViewers && token == null) {
            throw new IllegalArgumentException("--allow-viewers only makes sense together with --token");
        }
        if (bucketNs < 1_000_000L) {
            throw new IllegalArgumentException("dashboard bucket " + bucketNs + " ns is below 1 ms");
        }
        return this;
    }
}
