package dev.galebench.runner;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.galebench.report.CheckOutcome;
import dev.galebench.sequence.SequenceLibrary;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.DynamicTest;
import org.junit.jupiter.api.TestFactory;
import org.junit.jupiter.api.io.TempDir;

/**
 * Every shipped sequence passes offline against the reference controller (the virtual board
 * in-process), and its run folder has every file a reviewer and a CI server need.
 */
class LibraryOfflineTest {
    @TempDir
    static Path runs;

    @TestFactory
    Stream<DynamicTest> everyLibrarySequencePassesOffline() {
        return SequenceLibrary.names().stream().map(name -> DynamicTest.dynamicTest(name, () -> {
            SequenceRunner.Options o = new SequenceRunner.Options();
            o.offline = true;
            o.outBase = runs;
            o.progress = false;
            SequenceRunner.Result r = new SequenceRunner().run(SequenceLibrary.load(name), o);
            StringBuilder failed = new StringBuilder();
            for (CheckOutcome c : r.outcomes()) {
                if (!c.passed()) {
                    failed.append("\n  ").append(c.name()).append(": ").append(c.message());
                }
            }
            assertTrue(r.passed(), name + " failed:" + failed + (r.abortReason() == null ? "" : "\n  aborted: "
                    + r.abortReason()));
            assertEquals(0, r.exitCode());
            for (String f : List.of("report.html", "junit.xml", "summary.json", "recording.cfg", "recording.dat",
                    "timing.hlog", "waveform-digest.txt", "board-replies.bin", "sequence.yaml", "run.json",
                    "schedule.txt")) {
                assertTrue(Files.isRegularFile(r.folder().resolve(f)), name + ": " + f + " missing");
            }
        }));
    }
}
