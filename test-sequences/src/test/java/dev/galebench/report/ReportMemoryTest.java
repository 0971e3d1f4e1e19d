package dev.galebench.report;

import dev.galebench.testsupport.DemoRun;
import dev.galebench.testsupport.ReportInChildJvm;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * Memory stays flat: the reports of a long recording are written by a JVM whose whole heap is
 * smaller than the recording's samples held as doubles, so they cannot be kept in memory.
 */
class ReportMemoryTest {
    /** 60 s at 50 us = 1.2 M samples x 7 analog channels = 67 MB as doubles, written with a 32 MB heap. */
    @Test
    void shouldWriteTheReportsOfAMinuteLongRecordingWithin32MbOfHeap(@TempDir Path dir) throws Exception {
        DemoRun.record(dir, 60.0);
        ReportInChildJvm.Result r = ReportInChildJvm.run(dir, 60.0, 32);
        assertEquals(0, r.exitCode(), r.output());
        assertTrue(Files.size(dir.resolve("report.html")) < 1_500_000);
    }

    /** 10 minutes at 50 us = 12 M samples (672 MB as doubles), written with a 48 MB heap. */
    @Test
    @Tag("soak")
    void shouldWriteTheReportsOfATenMinuteRecordingWithin48MbOfHeap(@TempDir Path dir) throws Exception {
        DemoRun.record(dir, 600.0);
        long t0 = System.nanoTime();
        ReportInChildJvm.Result r = ReportInChildJvm.run(dir, 600.0, 48);
        double seconds = (System.nanoTime() - t0) / 1e9;
        assertEquals(0, r.exitCode(), r.output());
        System.out.printf("reports of a 10-minute recording (%d MB .dat) written in %.1f s with a 48 MB heap%n",
                Files.size(dir.resolve("recording.dat")) >> 20, seconds);
    }
}
