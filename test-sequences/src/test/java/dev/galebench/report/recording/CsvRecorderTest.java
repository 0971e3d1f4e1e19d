package dev.galebench.report.recording;

import dev.galebench.testsupport.ReportFixtures;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

class CsvRecorderTest {
    static final String[] NAMES = {"v_dc_v", "i_grid_a_a", "frt_active"};
    static final String[] UNITS = {"V", "A", "1"};

    @Test
    void shouldWriteValuesThatParseBackExactly(@TempDir Path dir) throws IOException {
        CsvRecorder r = new CsvRecorder(dir.resolve("run.csv"), null, 1);
        r.onStart(NAMES, UNITS, 50_000L, 1);
        ReportFixtures.feed(r, NAMES, 50_000L, 5, (k, t, v) -> {
            v[0] = 1100.0 + Math.PI * k;
            v[1] = k == 3 ? Double.NaN : -1.0e-7 * k;
            v[2] = k >= 2 ? 1 : 0;
        });
        r.onEnd(0);
        List<String> lines = Files.readAllLines(dir.resolve("run.csv"));
        assertEquals("exchange,time_s,v_dc_v,i_grid_a_a,frt_active", lines.get(0));
        assertEquals(6, lines.size());
        assertEquals("0,0.00005,1100.0,-0.0,0.0", lines.get(1));
        for (int k = 0; k < 5; k++) {
            String[] f = lines.get(k + 1).split(",", -1);
            assertEquals(k, Long.parseLong(f[0]));
            assertEquals((k + 1) * 50e-6, Double.parseDouble(f[1]), 1e-15);
            assertEquals(1100.0 + Math.PI * k, Double.parseDouble(f[2])); // exact: shortest round-trip form
            if (k == 3) {
                assertEquals("", f[3]);
            } else {
                assertEquals(-1.0e-7 * k, Double.parseDouble(f[3]));
            }
        }
        assertEquals(5, r.writtenLineCount());
    }

    @Test
    void shouldKeepOnlyChosenSignalsAndEveryNthSample(@TempDir Path dir) throws IOException {
        CsvRecorder r = new CsvRecorder(dir.resolve("few.csv"), List.of("frt_active", "v_dc_v"), 4);
        r.onStart(NAMES, UNITS, 50_000L, 1);
        ReportFixtures.feed(r, NAMES, 50_000L, 10, (k, t, v) -> v[0] = k);
        r.onEnd(0);
        List<String> lines = Files.readAllLines(dir.resolve("few.csv"));
        assertEquals(List.of("exchange,time_s,frt_active,v_dc_v", "0,0.00005,0.0,0.0", "4,0.00025,0.0,4.0", "8,0.00045,0.0,8.0"), lines);
    }

    @Test
    void shouldRejectASignalTheRunDoesNotRecord(@TempDir Path dir) {
        CsvRecorder r = new CsvRecorder(dir.resolve("x.csv"), List.of("v_dc_v", "no_such_signal"), 1);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> r.onStart(NAMES, UNITS, 50_000L, 1));
        assertTrue(e.getMessage().contains("no_such_signal"));
    }

    @Test
    void shouldWritePlantTimeInPlainDecimal() {
        StringBuilder s = new StringBuilder();
        CsvRecorder.appendSeconds(s, 600_000_000_000L);
        s.append(' ');
        CsvRecorder.appendSeconds(s, 1_000_010_000L);
        assertEquals("600 1.00001", s.toString());
    }

    @Test
    void shouldLeaveEveryLineUpToTheLastFlushWhenTheRunIsKilled(@TempDir Path dir) throws Exception {
        CsvRecorder r = new CsvRecorder(dir.resolve("killed.csv"), null, 1, 20_000_000L);
        r.onStart(NAMES, UNITS, 50_000L, 1);
        ReportFixtures.feed(r, NAMES, 50_000L, 100, (k, t, v) -> v[0] = k);
        Thread.sleep(40); // longer than the 20 ms flush interval
        dev.galebench.rt.Sample s = new dev.galebench.rt.Sample(NAMES.length);
        s.exchangeIndex = 100;
        s.plantTimeNs = 101 * 50_000L;
        r.onSample(s); // finds the interval passed: flushes
        // no onEnd: the process "died" here
        List<String> lines = Files.readAllLines(dir.resolve("killed.csv"));
        assertEquals(102, lines.size());
        assertEquals("100,0.00505,0.0,0.0,0.0", lines.get(101));
    }
}
