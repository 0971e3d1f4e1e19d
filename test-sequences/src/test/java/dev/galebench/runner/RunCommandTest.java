package dev.galebench.runner;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.galebench.cli.GalebenchCommand;
import dev.galebench.report.CheckOutcome;
import dev.galebench.sequence.SequenceLibrary;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import picocli.CommandLine;

class RunCommandTest {

    /** Runs the command line as {@code main} does, capturing its out and err (runs pass --quiet: no progress bar). */
    private static String[] galebench(int expectedExit, String... args) {
        CommandLine cl = GalebenchCommand.commandLine();
        StringWriter out = new StringWriter(), err = new StringWriter();
        cl.setOut(new PrintWriter(out));
        cl.setErr(new PrintWriter(err));
        int code = cl.execute(args);
        assertEquals(expectedExit, code, "out:\n" + out + "\nerr:\n" + err);
        return new String[] {out.toString(), err.toString()};
    }

    @Test
    void shouldFailTheKFactorCheckWhenTheControllerInjectsNoReactiveCurrent(@TempDir Path dir) throws Exception {
        // the shipped dip sequence, pointed at a controller file with k = 0
        Files.writeString(dir.resolve("no-reactive.yaml"), "frt:\n  k_factor: 0.0\n");
        String text = SequenceLibrary.text("dip-3ph-50pct").replace("initial:", "controller: no-reactive.yaml\ninitial:");
        Path seq = dir.resolve("dip-k0.yaml");
        Files.writeString(seq, text);
        String[] io = galebench(1, "run", seq.toString(), "--offline", "--quiet", "--out", dir.resolve("runs").toString());
        String out = io[0];
        assertTrue(out.contains("FAIL  k-factor"), out);
        assertTrue(out.contains("i_reactive_pu left the tolerance at 1.06"), out);
        assertTrue(out.contains("FAILED:"), out);
        assertFalse(out.contains("FAIL  dc-link-limit"), out);
    }

    @Test
    void shouldFeedTheLiveConsoleWhenAsked(@TempDir Path dir) throws Exception {
        String out = galebench(0, "run", "link-silence-watchdog", "--offline", "--quiet", "--dashboard=0", "--out",
                dir.toString())[0];
        assertTrue(out.startsWith("live console: http://127.0.0.1:"), out);
        assertTrue(out.contains("PASSED: 3 of 3 checks passed"), out);
    }

    @Test
    void shouldExitTwoWithFileLineColumnForABadFile(@TempDir Path dir) throws Exception {
        Path seq = dir.resolve("bad.yaml");
        Files.writeString(seq, SequenceLibrary.text("wind-step-partial-load").replace("to_m_s: 9.0", "to_m_s: fast"));
        String err = galebench(2, "run", seq.toString(), "--offline", "--quiet", "--out", dir.toString())[1];
        assertTrue(err.contains(seq + ":19:25: 'to_m_s' in 'wind_step' in an action must be a number, found 'fast'"), err);
    }

    @Test
    void shouldExitTwoListingValidSignalsForAnUnknownOne(@TempDir Path dir) throws Exception {
        Path seq = dir.resolve("sig.yaml");
        Files.writeString(seq, SequenceLibrary.text("wind-step-partial-load").replace("signal: v_dc_v", "signal: vdc"));
        String err = galebench(2, "run", seq.toString(), "--offline", "--quiet", "--out", dir.toString())[1];
        assertTrue(err.contains("unknown signal 'vdc'; valid signals: wind_m_s,") && err.contains("v_dc_v"), err);
        try (var s = Files.list(dir)) {
            assertEquals(1, s.count(), "nothing was run: no run folder");
        }
    }

    @Test
    void shouldExitTwoForAnUnknownSequenceOrBoard(@TempDir Path dir) {
        String e1 = galebench(2, "run", "no-such-sequence", "--offline", "--quiet")[1];
        assertTrue(e1.contains("library sequences: wind-step-partial-load"), e1);
        String e2 = galebench(2, "run", "dip-3ph-50pct", "--board", "tcp://x", "--quiet")[1];
        assertTrue(e2.contains("--board tcp://x"), e2);
        String e3 = galebench(2, "run", "dip-3ph-50pct", "--offline", "--board", "udp://127.0.0.1:9", "--quiet")[1];
        assertTrue(e3.contains("--offline runs the virtual board in-process"), e3);
    }

    @Test
    void shouldAbortOnAHardwareTripWithTheTripInTheVerdict(@TempDir Path dir) throws Exception {
        // silence without allowing the watchdog trip: the run must stop at the trip, exit 1
        String text = SequenceLibrary.text("link-silence-watchdog").replace("allow_trips: [link_watchdog]\n", "");
        Path seq = dir.resolve("silence.yaml");
        Files.writeString(seq, text);
        SequenceRunner.Options o = new SequenceRunner.Options();
        o.offline = true;
        o.outBase = dir;
        o.progress = false;
        SequenceRunner.Result r = new SequenceRunner().run(dev.galebench.sequence.SequenceParser.parseFile(seq), o);
        assertFalse(r.passed());
        assertTrue(r.abortReason().startsWith("hardware trip (link watchdog) at 0.50"), r.abortReason());
        assertTrue(r.loop().steps < 12_000, "stopped right after the trip: " + r.loop().steps);
        for (CheckOutcome c : r.outcomes()) {
            if (c.name().equals("no-other-trip")) {
                assertFalse(c.passed(), "the window reaches past the abort");
                assertTrue(c.message().contains("aborted"), c.message());
            }
        }
        String junit = Files.readString(r.folder().resolve("junit.xml"));
        assertTrue(junit.contains("failure"), junit);
    }
}
