package dev.galebench.report.recording;

import dev.galebench.report.comtrade.ComtradeConfig;
import dev.galebench.report.comtrade.ComtradeReader;
import dev.galebench.report.comtrade.DecimatedTraces;
import dev.galebench.testsupport.ReportFixtures;
import dev.galebench.rt.Sample;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** The recorder while a run goes on: files readable at any moment, gaps, ranges, decimated read-back. */
class ComtradeRecorderStreamingTest {
    static final String[] NAMES = {"v_term_a_v", "i_grid_a_a", "trip_flags", "frt_active"};
    static final String[] UNITS = {"V", "A", "bits", "1"};
    static final long PERIOD_NS = 50_000L;

    static ComtradeSettings settings(long flushIntervalNs) {
        return new ComtradeSettings("GALEBENCH", "stream", 2013, 50.0, Instant.parse("2026-01-01T00:00:00Z"), -1L, 1.0,
                new SignalRanges(ReportFixtures.smallTurbine()), SignalRanges.digitalChannels(), flushIntervalNs);
    }

    static void wave(long k, double t, double[] v) {
        v[0] = 563.4 * Math.sin(2 * Math.PI * 50 * t);
        v[1] = 3818.0 * Math.sin(2 * Math.PI * 50 * t - 0.2);
        v[2] = 0;
        v[3] = 0;
    }

    @Test
    void shouldLeaveAReadableRecordingUpToTheLastFlushWhenTheRunIsKilled(@TempDir Path dir) throws Exception {
        ComtradeRecorder r = new ComtradeRecorder(dir, "killed", settings(20_000_000L));
        r.onStart(NAMES, UNITS, PERIOD_NS, 1);
        // readable with zero samples right after start
        assertEquals(0, ComtradeReader.open(r.cfgPath()).config().announcedRecordCount());
        ReportFixtures.feed(r, NAMES, PERIOD_NS, 200, ComtradeRecorderStreamingTest::wave);
        Thread.sleep(40); // more than the 20 ms flush interval of wall-clock time
        Sample s = new Sample(NAMES.length);
        s.exchangeIndex = 200;
        s.plantTimeNs = 201 * PERIOD_NS;
        wave(200, s.plantTimeNs * 1e-9, s.values);
        r.onSample(s); // this sample finds the interval passed and flushes
        ComtradeReader reader = ComtradeReader.open(r.cfgPath());
        assertEquals(201, reader.config().announcedRecordCount());
        double[] last = new double[1];
        assertEquals(201, reader.read((n, t, a, st) -> last[0] = a[0]));
        assertEquals(563.4 * Math.sin(2 * Math.PI * 50 * 201 * 50e-6), last[0], reader.config().analogChannels.get(0).a());

        // more samples, no onEnd (the process "dies"): whatever was flushed stays consistent
        s.exchangeIndex = 201;
        s.plantTimeNs = 202 * PERIOD_NS;
        r.onSample(s);
        ComtradeReader again = ComtradeReader.open(r.cfgPath());
        long announced = again.config().announcedRecordCount();
        assertTrue(announced == 201 || announced == 202, "announced " + announced);
        assertTrue(Files.size(r.datPath()) >= announced * again.binaryRecordBytes());
        assertEquals(announced, again.read((n, t, a, st) -> { }));
        assertFalse(Files.exists(dir.resolve("killed.cfg.tmp")), "temporary .cfg left behind");
    }

    @Test
    void shouldMarkStampsCriticalAndKeepPlantTimeWhenSamplesWereMissed(@TempDir Path dir) throws IOException {
        ComtradeRecorder r = new ComtradeRecorder(dir, "gaps", settings(ComtradeSettings.MAX_FLUSH_INTERVAL_NS));
        r.onStart(NAMES, UNITS, PERIOD_NS, 1);
        Sample s = new Sample(NAMES.length);
        long[] exchanges = {0, 1, 2, 10, 11};
        for (long k : exchanges) {
            s.exchangeIndex = k;
            s.plantTimeNs = (k + 1) * PERIOD_NS;
            r.onSample(s);
        }
        r.onEnd(7);
        assertEquals(1, r.gapCount());
        assertEquals(7, r.samplesMissed());
        ComtradeReader reader = ComtradeReader.open(r.cfgPath());
        assertTrue(reader.config().stampsCritical);
        List<Double> times = new ArrayList<>();
        List<Long> numbers = new ArrayList<>();
        reader.read((n, t, a, st) -> {
            times.add(t);
            numbers.add(n);
        });
        assertEquals(List.of(1L, 2L, 3L, 4L, 5L), numbers); // numbered 1..N in the file
        assertEquals(List.of(0.0, 50e-6, 100e-6, 500e-6, 550e-6), times.stream().map(x -> Math.rint(x * 1e9) / 1e9).toList());
    }

    @Test
    void shouldRecordStatusBitsAsDigitalChannelsAndNotAsAnalog(@TempDir Path dir) throws IOException {
        ComtradeRecorder r = new ComtradeRecorder(dir, "bits", settings(ComtradeSettings.MAX_FLUSH_INTERVAL_NS));
        r.onStart(NAMES, UNITS, PERIOD_NS, 1);
        ReportFixtures.feed(r, NAMES, PERIOD_NS, 3, (k, t, v) -> {
            v[2] = k == 2 ? (1 << 8) | (1 << 11) : 0; // dc overvoltage + link watchdog trips
            v[3] = k >= 1 ? 1 : 0;
        });
        r.onEnd(0);
        ComtradeConfig c = ComtradeReader.open(r.cfgPath()).config();
        assertEquals(List.of("v_term_a_v", "i_grid_a_a"), c.analogChannels.stream().map(ComtradeConfig.AnalogChannel::id).toList());
        int ov = c.statusIndexOf("trip_dc_overvoltage");
        int wd = c.statusIndexOf("trip_link_watchdog");
        int gsc = c.statusIndexOf("trip_gsc_overcurrent");
        int frt = c.statusIndexOf("frt_active");
        assertTrue(ov >= 0 && wd >= 0 && gsc >= 0 && frt >= 0);
        List<String> states = new ArrayList<>();
        ComtradeReader.open(r.cfgPath()).read((n, t, a, st) -> states.add(
                (st[ov] ? "O" : "-") + (st[wd] ? "W" : "-") + (st[gsc] ? "G" : "-") + (st[frt] ? "F" : "-")));
        assertEquals(List.of("----", "---F", "OW-F"), states);
    }

    @Test
    void shouldChooseRangesFromRatingsSoAFaultCurrentIsNotClipped(@TempDir Path dir) throws IOException {
        SignalRanges ranges = new SignalRanges(ReportFixtures.smallTurbine());
        // ratings of the fixture turbine: GSC trip 5200 A peak, DC trip 1300 V, LV 690 V
        assertEquals(SignalRange.symmetric(7800.0, ranges.rangeOf("i_grid_a_a", "A").source()), ranges.rangeOf("i_grid_a_a", "A"));
        assertEquals(1625.0, ranges.rangeOf("v_dc_v", "V").maxValue(), 1e-9);
        assertEquals(1.5 * Math.sqrt(2.0 / 3.0) * 690.0, ranges.rangeOf("v_term_b_v", "V").maxValue(), 1e-9);
        assertTrue(ranges.rangeOf("mystery_signal", "furlong").source().startsWith("fallback"));
        ranges.override("i_grid_a_a", SignalRange.symmetric(100.0, "caller"));
        assertEquals(100.0, ranges.rangeOf("i_grid_a_a", "A").maxValue());

        // one quiet second, then a fault current 1.4 x the trip level: inside the range, nothing clamped
        ComtradeRecorder r = new ComtradeRecorder(dir, "fault", settings(ComtradeSettings.MAX_FLUSH_INTERVAL_NS));
        r.onStart(NAMES, UNITS, PERIOD_NS, 1);
        ReportFixtures.feed(r, NAMES, PERIOD_NS, 30_000, (k, t, v) -> {
            double amplitude = t < 1.0 ? 3818.0 : 1.4 * 5200.0;
            v[0] = 563.4 * Math.sin(2 * Math.PI * 50 * t);
            v[1] = amplitude * Math.sin(2 * Math.PI * 50 * t);
        });
        r.onEnd(0);
        assertEquals(0, r.totalClampedSampleCount());
        DecimatedTraces d = DecimatedTraces.read(ComtradeReader.open(r.cfgPath()), List.of("i_grid_a_a"), 500);
        double max = 0;
        for (double v : d.trace("i_grid_a_a").value()) {
            max = Math.max(max, v);
        }
        assertEquals(1.4 * 5200.0, max, 2.0);
    }

    @Test
    void shouldKeepEverySpikeWhenReadingBackDecimated(@TempDir Path dir) throws IOException {
        ComtradeRecorder r = new ComtradeRecorder(dir, "long", settings(ComtradeSettings.MAX_FLUSH_INTERVAL_NS));
        r.onStart(NAMES, UNITS, PERIOD_NS, 1);
        long n = 200_000; // 10 s at 50 us
        ReportFixtures.feed(r, NAMES, PERIOD_NS, n, (k, t, v) -> {
            v[0] = k == 123_457 ? 900.0 : 100.0 * Math.sin(2 * Math.PI * 50 * t);
            v[1] = Double.NaN;
        });
        r.onEnd(0);
        DecimatedTraces d = DecimatedTraces.read(ComtradeReader.open(r.cfgPath()), List.of("v_term_a_v", "i_grid_a_a", "frt_active", "nope"), 1000);
        assertEquals(n, d.recordsRead());
        DecimatedTraces.Trace v = d.trace("v_term_a_v");
        assertTrue(v.size() <= 2000 && v.size() > 1000, "points " + v.size());
        int spikeAt = -1;
        for (int i = 0; i < v.size(); i++) {
            if (v.value()[i] > 800) {
                spikeAt = i;
            }
        }
        assertTrue(spikeAt >= 0, "spike lost by decimation");
        assertEquals(123_457 * 50e-6, v.timeS()[spikeAt], 1e-9);
        assertEquals(0, d.trace("i_grid_a_a").size()); // all missing
        assertEquals(3, d.traces().size()); // unknown id skipped
        assertNull(d.trace("nope"));
        for (int i = 1; i < v.size(); i++) {
            assertTrue(v.timeS()[i] > v.timeS()[i - 1], "times not increasing at " + i);
        }
    }

    @Test
    void shouldReadZoomWindowsAtFullResolutionInOnePass(@TempDir Path dir) throws IOException {
        ComtradeRecorder r = new ComtradeRecorder(dir, "zoom", settings(ComtradeSettings.MAX_FLUSH_INTERVAL_NS));
        r.onStart(NAMES, UNITS, PERIOD_NS, 1);
        ReportFixtures.feed(r, NAMES, PERIOD_NS, 100_000, ComtradeRecorderStreamingTest::wave); // 5 s
        r.onEnd(0);
        List<DecimatedTraces.Trace> t = DecimatedTraces.readWindows(ComtradeReader.open(r.cfgPath()), List.of(
                new DecimatedTraces.Window("v_term_a_v", 0.0, 5.0, 100),
                new DecimatedTraces.Window("v_term_a_v", 2.0, 2.01, 1000),
                new DecimatedTraces.Window("frt_active", 1.0, 2.0, 10),
                new DecimatedTraces.Window("unknown", 0.0, 1.0, 10)));
        assertTrue(t.get(0).size() <= 200);
        // 10 ms at 50 us is 201 records (both ends included), each its own bucket: the samples themselves
        assertEquals(201, t.get(1).size());
        assertEquals(2.0, t.get(1).timeS()[0], 1e-9);
        double tk = t.get(1).timeS()[100];
        assertEquals(563.4 * Math.sin(2 * Math.PI * 50 * (tk + 50e-6)), t.get(1).value()[100], 0.013);
        assertEquals("state", t.get(2).unit());
        assertEquals(10, t.get(2).size()); // constant 0: one point per bucket
        assertEquals(0, t.get(3).size());
    }
}
