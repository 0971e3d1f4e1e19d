package dev.galebench.testsupport;

import dev.galebench.report.CheckOutcome;
import dev.galebench.report.RunReportInput;
import dev.galebench.rt.LinkCounters;
import org.HdrHistogram.Histogram;

import java.time.Instant;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/** Report inputs shared by the report tests: a passing and a failing sequence run. */
public final class RunInputs {
    private RunInputs() {
    }

    public static CheckOutcome passedDcBand() {
        return new CheckOutcome("dc_link_stays_in_band", "band", true, "1182 V max", "<= 1250 V",
                "DC-link voltage stayed inside the band", "v_dc_v", 0.1, 0.9, 1000.0, 1250.0);
    }

    public static CheckOutcome failedReactiveRise() {
        return new CheckOutcome("reactive_current_rise", "rise_time", false, "41.5 ms", "<= 30 ms",
                "Reactive current reached 90 % of its step 11.5 ms late <&> \"quoted\"", "i_reactive_pu", 0.2, 0.35,
                0.9, Double.NaN);
    }

    /** Histogram in ns holding {@code count} values spread evenly over 1..count microseconds. */
    public static Histogram evenMicros(int count) {
        Histogram h = new Histogram(3_600_000_000_000L, 3);
        for (int i = 1; i <= count; i++) {
            h.recordValue(i * 1000L);
        }
        return h;
    }

    public static LinkCounters counters() {
        LinkCounters c = new LinkCounters();
        c.framesSent = 20_000;
        c.repliesAccepted = 19_990;
        c.crcErrors = 3;
        c.missingReplies = 7;
        return c;
    }

    public static Map<String, String> environment() {
        Map<String, String> env = new LinkedHashMap<>();
        env.put("jvm", "OpenJDK 64-Bit Server VM 17.0.15");
        env.put("jvm_flags", "-Xms1g -Xmx1g -XX:+UseParallelGC");
        env.put("cpu", "2 x test cpu");
        env.put("host", "bench-7");
        return env;
    }

    public static RunReportInput.Builder failing() {
        return RunReportInput.builder("lvrt_dip_50pct")
                .sequenceFile("sequences/lvrt_dip_50pct.yaml")
                .description("Balanced dip to 0.5 pu for 150 ms at rated power.")
                .passed(false)
                .checks(List.of(passedDcBand(), failedReactiveRise()))
                .latenessNs(evenMicros(1000))
                .computeNs(evenMicros(100))
                .roundTripNs(evenMicros(2000))
                .overruns(4)
                .exchanges(20_000)
                .link(counters())
                .environment(environment())
                .startedAt(Instant.parse("2026-12-02T09:30:00Z"))
                .plantDurationS(1.0)
                .comtradeBaseName("recording")
                .timingLogFileName("timing.hlog");
    }
}
