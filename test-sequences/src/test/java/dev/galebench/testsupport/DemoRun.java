package dev.galebench.testsupport;

import dev.galebench.plant.SensorView;
import dev.galebench.report.CheckOutcome;
import dev.galebench.report.RunReportInput;
import dev.galebench.report.recording.ComtradeRecorder;
import dev.galebench.report.recording.ComtradeSettings;
import dev.galebench.report.recording.SignalRanges;
import dev.galebench.plant.BoardCommand;

import java.io.IOException;
import java.nio.file.Path;
import java.time.Instant;
import java.util.List;

/**
 * A synthetic run folder for the report tests: a balanced dip to 0.5 pu from 1.0 s to 1.15 s,
 * the terminal current answering with reactive current after a delay, a DC-link bump and a
 * chopper pulse, recorded through the real {@link ComtradeRecorder}. The waveforms are shapes
 * made up for the test, not physics.
 */
public final class DemoRun {
    public static final String[] NAMES = {"v_term_pu", "i_reactive_pu", "i_active_pu", "v_dc_v", "i_grid_a_a", "i_grid_b_a",
            "i_grid_c_a", "frt_active", "trip_flags", "status_flags", "board_status"};
    public static final String[] UNITS = {"pu", "pu", "pu", "V", "A", "A", "A", "1", "bits", "bits", "bits"};
    public static final long PERIOD_NS = 50_000L;

    private DemoRun() {
    }

    /** Records {@code seconds} of plant time into {@code dir/recording.cfg|dat}; returns the recorder. */
    public static ComtradeRecorder record(Path dir, double seconds) {
        ComtradeSettings s = new ComtradeSettings("GALEBENCH", "lvrt_dip_50pct", 2013, 50.0, Instant.parse("2026-12-02T09:30:00Z"),
                1_000_000_000L, 1.0, new SignalRanges(ReportFixtures.smallTurbine()), SignalRanges.digitalChannels(),
                ComtradeSettings.MAX_FLUSH_INTERVAL_NS);
        ComtradeRecorder r = new ComtradeRecorder(dir, "recording", s);
        r.onStart(NAMES, UNITS, PERIOD_NS, 1);
        long n = Math.round(seconds * 1e9 / PERIOD_NS);
        ReportFixtures.feed(r, NAMES, PERIOD_NS, n, DemoRun::fill);
        r.onEnd(0);
        return r;
    }

    static void fill(long k, double t, double[] v) {
        boolean dip = t >= 1.0 && t < 1.15;
        double recover = t >= 1.15 ? Math.exp(-(t - 1.15) / 0.02) : 0.0;
        double u = dip ? 0.5 + 0.02 * Math.exp(-(t - 1.0) / 0.005) : 1.0 - 0.5 * recover * 0.3;
        double iq = dip ? 1.0 * (1 - Math.exp(-Math.max(0, t - 1.012) / 0.008)) : 0.25 * recover;
        double ip = dip ? 0.3 : 0.9 - 0.6 * recover;
        v[0] = u + 0.002 * Math.sin(2 * Math.PI * 300 * t);
        v[1] = iq;
        v[2] = ip;
        v[3] = 1100 + (dip ? 90 * (1 - Math.exp(-(t - 1.0) / 0.01)) : 90 * recover) + 4 * Math.sin(2 * Math.PI * 600 * t);
        double amp = 3818.0 * Math.hypot(ip, iq);
        double ang = Math.atan2(iq, ip);
        for (int ph = 0; ph < 3; ph++) {
            v[4 + ph] = amp * Math.sin(2 * Math.PI * 50 * t + ang - ph * 2 * Math.PI / 3);
        }
        if (t >= 1.0 && t < 1.0005) {
            v[4] = 8400.0; // a short spike beyond the recording range of i_grid_a_a (+-7800 A): clamped and counted
        }
        v[7] = t >= 1.005 && t < 1.35 ? 1 : 0;
        v[8] = 0;
        v[9] = SensorView.STATUS_BREAKER_CLOSED | (t > 1.02 && t < 1.05 ? SensorView.STATUS_CHOPPER_ON : 0);
        v[10] = BoardCommand.BOARD_RUNNING | BoardCommand.BOARD_PLL_LOCKED | (v[7] > 0 ? BoardCommand.BOARD_FRT_ACTIVE : 0);
    }

    public static List<CheckOutcome> checks() {
        return List.of(
                new CheckOutcome("dc_link_within_limits", "band", true, "1191.3 V max", "900 .. 1250 V",
                        "The DC-link voltage stayed inside its band through the dip.", "v_dc_v", 0.9, 1.6, 900.0, 1250.0),
                new CheckOutcome("reactive_current_rise", "rise_time", false, "41.5 ms", "<= 30 ms",
                        "Reactive current reached 90 % of its step 11.5 ms too late <&>.", "i_reactive_pu", 1.0, 1.15, 0.9, Double.NaN),
                new CheckOutcome("voltage_recovers", "settle", true, "62 ms", "<= 500 ms",
                        "Terminal voltage back inside 0.9 .. 1.1 pu after clearance.", "v_term_pu", 1.15, 1.7, 0.9, 1.1),
                new CheckOutcome("no_trip", "flag_never", true, "0 trips", "no trip bit set",
                        "No hardware trip during the sequence.", null, Double.NaN, Double.NaN, Double.NaN, Double.NaN));
    }

    public static RunReportInput.Builder input(double seconds) {
        return RunInputs.failing()
                .checks(checks())
                .exchanges(Math.round(seconds * 1e9 / PERIOD_NS))
                .plantDurationS(seconds)
                .comtradeBaseName("recording")
                .plotSignals(List.of("v_term_pu", "i_grid_a_a", "frt_active"));
    }

    /** Writes the recording and every end-of-run file into {@code dir}. */
    public static void writeFolder(Path dir, double seconds) throws IOException {
        ComtradeRecorder r = record(dir, seconds);
        dev.galebench.report.RunReports.writeAll(dir, input(seconds).recording(dev.galebench.report.RecordingStats.of(r)).build());
    }
}
