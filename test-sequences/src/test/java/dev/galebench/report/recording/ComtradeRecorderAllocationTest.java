package dev.galebench.report.recording;

import dev.galebench.testsupport.ReportFixtures;
import dev.galebench.rt.Sample;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.lang.management.ManagementFactory;
import java.nio.file.Path;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * The recorder keeps memory flat: per sample it allocates nothing (only a flush, at most once a
 * second, builds the new .cfg text), so a 10-minute run costs no more heap than a 10-second one.
 */
class ComtradeRecorderAllocationTest {
    @Test
    void shouldAllocateNothingPerSampleBetweenFlushes(@TempDir Path dir) {
        String[] names = new String[48];
        String[] units = new String[48];
        for (int i = 0; i < names.length; i++) {
            names[i] = "sig" + i + "_v";
            units[i] = "V";
        }
        names[46] = "trip_flags";
        names[47] = "frt_active";
        ComtradeSettings s = ComtradeSettings.defaults("alloc", 50.0, new SignalRanges(ReportFixtures.smallTurbine()));
        ComtradeRecorder r = new ComtradeRecorder(dir, "alloc", s);
        r.onStart(names, units, 50_000L, 1);
        Sample sample = new Sample(names.length);
        com.sun.management.ThreadMXBean mx = (com.sun.management.ThreadMXBean) ManagementFactory.getThreadMXBean();
        long tid = Thread.currentThread().getId();
        for (int warm = 0; warm < 200_000; warm++) {
            step(r, sample, warm);
        }
        r.flush(); // start the measured stretch with an empty buffer and a fresh flush clock
        long before = mx.getThreadAllocatedBytes(tid);
        long flushesBefore = System.nanoTime();
        int n = 1_000_000;
        for (int k = 200_000; k < 200_000 + n; k++) {
            step(r, sample, k);
        }
        long allocated = mx.getThreadAllocatedBytes(tid) - before;
        double seconds = (System.nanoTime() - flushesBefore) / 1e9;
        r.onEnd(0);
        assertEquals(1_200_000, r.recordCount());
        // at most one flush per second; each builds a .cfg of ~4 KiB text: allow 64 KiB per flush
        long allowed = (long) (Math.ceil(seconds) + 1) * 64 * 1024;
        assertTrue(allocated <= allowed, "allocated " + allocated + " B over " + n + " samples in " + seconds + " s");
    }

    private static void step(ComtradeRecorder r, Sample sample, int k) {
        sample.exchangeIndex = k;
        sample.plantTimeNs = (k + 1) * 50_000L;
        for (int i = 0; i < 46; i++) {
            sample.values[i] = Math.sin(k * 1e-3 + i);
        }
        r.onSample(sample);
    }
}
