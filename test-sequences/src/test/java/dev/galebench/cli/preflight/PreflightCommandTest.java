package dev.galebench.cli.preflight;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.galebench.cli.GalebenchCommand;
import org.HdrHistogram.HistogramLogReader;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import picocli.CommandLine;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Path;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * The preflight command end to end: spin floor, then the real loop with the default turbine and
 * the virtual board answering over real UDP sockets on loopback. Asserts the shape and the
 * counts, and that the exit code agrees with the verdict; never the latency numbers themselves.
 */
class PreflightCommandTest {

    private static int run(StringWriter out, StringWriter err, String... args) {
        CommandLine cl = GalebenchCommand.commandLine();
        cl.setOut(new PrintWriter(out, true));
        cl.setErr(new PrintWriter(err, true));
        return cl.execute(args);
    }

    @Test
    void shouldPrintFloorAndLoopAsJsonAndExitByVerdict(@TempDir Path dir) throws Exception {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        Path hlog = dir.resolve("timing.hlog");
        int code = run(out, err, "preflight", "--seconds", "0.4", "--step-us", "50", "--warmup", "0.2", "--json", "--hlog", hlog.toString());
        JsonNode j = new ObjectMapper().readTree(out.toString());
        assertEquals(50, j.get("step_us").asLong());
        assertEquals(0.4, j.get("seconds").asDouble(), 1e-12);
        for (String p : new String[] {"p50", "p99", "p999", "p9999", "max"}) {
            assertTrue(j.get("floor").get("lateness_us").has(p), p);
            assertTrue(j.get("loop").get("lateness_us").has(p), p);
            assertTrue(j.get("loop").get("rtt_us").has(p), p);
        }
        assertTrue(j.get("floor").get("stalls").asLong() >= 0);
        assertEquals(1, j.get("rounds").asInt(), "one round per 5 s by default");
        assertEquals(8000, j.get("floor").get("ticks").asLong());
        assertEquals(8000, j.get("loop").get("exchanges").asLong());
        assertTrue(j.get("loop").get("overruns").asLong() >= 0);
        assertTrue(j.get("loop").get("replies_applied").asLong() > 0, "the virtual board answered over UDP");
        assertTrue(j.get("loop").get("rtt_us").get("max").asDouble() > 0.0);
        assertEquals(j.get("sustainable").asBoolean() ? 0 : 1, code, out + " " + err);
        assertEquals(0.2, j.get("warmup_s").asDouble(), 1e-12);
        JsonNode io = j.get("io_floor");
        for (String p : new String[] {"p50", "p99", "p999", "p9999", "max"}) {
            assertTrue(io.get("lateness_us").has(p), p);
        }
        assertEquals(8000, io.get("ticks").asLong(), "the I/O floor runs as long as the floor");
        assertTrue(io.get("echoes").asLong() > 0, "the echo answered over UDP");
        assertEquals(1, j.get("per_round").get("io_floor_stalls").size());
        try (HistogramLogReader r = new HistogramLogReader(hlog.toFile())) {
            assertTrue(r.nextIntervalHistogram() != null, "timing log written");
        }
    }

    @Test
    void shouldPrintTableWithVerdict() {
        StringWriter out = new StringWriter();
        int code = run(out, new StringWriter(), "preflight", "--seconds", "0.2", "--warmup", "0.1");
        String text = out.toString();
        assertTrue(text.contains("floor lateness") && text.contains("i/o floor") && text.contains("loop rtt"), text);
        assertTrue(text.contains("warm-up: 100000 exchanges offline, then one round not counted: floor and I/O floor 0.5 s, loop 0.1 s"), text);
        assertTrue(text.contains(code == 0 ? "verdict: SUSTAINABLE" : "verdict: NOT SUSTAINABLE"), text);
    }

    @Test
    void shouldSkipTheIoFloorAndTheWarmUpWhenAsked() throws Exception {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = run(out, err, "preflight", "--seconds", "0.2", "--no-io-floor", "--warmup", "0", "--json");
        JsonNode j = new ObjectMapper().readTree(out.toString());
        assertTrue(!j.has("io_floor"), out.toString());
        assertEquals(0.0, j.get("warmup_s").asDouble(), 0.0);
        assertEquals(4000, j.get("loop").get("exchanges").asLong());
        assertEquals(j.get("sustainable").asBoolean() ? 0 : 1, code, err.toString());
    }

    @Test
    void shouldTickTheFloorsAtTheExchangePeriodWhenExchangingEveryMSteps() throws Exception {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = run(out, err, "preflight", "--seconds", "0.4", "--step-us", "50", "--exchange-every", "4",
                "--warmup", "0.1", "--json");
        JsonNode j = new ObjectMapper().readTree(out.toString());
        assertEquals(4, j.get("exchange_every").asInt());
        assertEquals(200, j.get("exchange_us").asLong());
        assertEquals(2000, j.get("loop").get("exchanges").asLong(), "0.4 s of 200 us exchanges");
        assertEquals(2000, j.get("floor").get("ticks").asLong(), "the floor ticks at the exchange period");
        assertEquals(2000, j.get("io_floor").get("ticks").asLong());
        assertTrue(j.get("loop").get("replies_applied").asLong() > 0, err.toString());
        assertEquals(j.get("sustainable").asBoolean() ? 0 : 1, code, err.toString());
    }

    @Test
    void shouldSweepStepsAndNameTheSmallestThatHolds() throws Exception {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = run(out, err, "preflight", "--sweep", "100,50", "--seconds", "0.2", "--warmup", "0.1", "--no-io-floor", "--json");
        JsonNode j = new ObjectMapper().readTree(out.toString());
        JsonNode sweep = j.get("sweep");
        assertEquals(2, sweep.size(), out.toString());
        assertEquals(100, sweep.get(0).get("step_us").asLong());
        assertEquals(50, sweep.get(1).get("step_us").asLong());
        assertEquals(2000, sweep.get(0).get("loop").get("exchanges").asLong(), "0.2 s at 100 us");
        assertEquals(4000, sweep.get(1).get("loop").get("exchanges").asLong(), "0.2 s at 50 us");
        // the smallest sustainable step is derived from the per-step verdicts, whatever this machine does now
        long expected = -1;
        for (JsonNode r : sweep) {
            if (r.get("sustainable").asBoolean() && (expected < 0 || r.get("step_us").asLong() < expected)) {
                expected = r.get("step_us").asLong();
            }
        }
        JsonNode smallest = j.get("smallest_sustainable_step_us");
        assertEquals(expected, smallest.isNull() ? -1 : smallest.asLong(), out.toString());
        assertEquals(expected > 0 ? 0 : 1, code, err.toString());
    }

    @Test
    void shouldPrintEachStepAndASweepSummaryAsText() {
        StringWriter out = new StringWriter();
        int code = run(out, new StringWriter(), "preflight", "--sweep", "200", "--seconds", "0.1", "--warmup", "0.1");
        String text = out.toString();
        assertTrue(text.contains("galebench preflight: step 200 us"), text);
        assertTrue(text.contains("sweep summary"), text);
        assertTrue(text.contains(code == 0 ? "smallest step that holds: 200 us" : "none of these steps holds"), text);
    }

    @Test
    void shouldRejectBadInputWithExitTwo() {
        StringWriter err = new StringWriter();
        assertEquals(2, run(new StringWriter(), err, "preflight", "--step-us", "0"));
        assertTrue(err.toString().contains("--step-us"), err.toString());
        err = new StringWriter();
        assertEquals(2, run(new StringWriter(), err, "preflight", "--sweep", "50,0"));
        assertTrue(err.toString().contains("--sweep step 0"), err.toString());
        err = new StringWriter();
        assertEquals(2, run(new StringWriter(), err, "preflight", "--sweep", "50", "--step-us", "50"));
        assertTrue(err.toString().contains("not both"), err.toString());
        err = new StringWriter();
        assertEquals(2, run(new StringWriter(), err, "preflight", "--sweep", "50", "--hlog", "x.hlog"));
        assertTrue(err.toString().contains("--hlog"), err.toString());
        err = new StringWriter();
        assertEquals(2, run(new StringWriter(), err, "preflight", "--seconds", "0.001", "--rounds", "100"));
        assertTrue(err.toString().contains("less than one exchange per round"), err.toString());
        err = new StringWriter();
        assertEquals(2, run(new StringWriter(), err, "preflight", "--exchange-every", "0"));
        assertTrue(err.toString().contains("--exchange-every"), err.toString());
        err = new StringWriter();
        assertEquals(2, run(new StringWriter(), err, "preflight", "--warmup", "-1"));
        assertTrue(err.toString().contains("--warmup"), err.toString());
        err = new StringWriter();
        assertEquals(2, run(new StringWriter(), err, "preflight", "--seconds", "-1"));
        assertTrue(err.toString().contains("--seconds"), err.toString());
        err = new StringWriter();
        assertEquals(2, run(new StringWriter(), err, "preflight", "--seconds", "0.1", "--board", "ftp://nowhere"));
        assertTrue(err.toString().contains("ftp://nowhere"), err.toString());
        err = new StringWriter();
        assertEquals(2, run(new StringWriter(), err, "preflight", "--seconds", "0.1", "--controller", "nosuch"));
        assertTrue(err.toString().contains("nosuch"), err.toString());
        assertEquals(2, run(new StringWriter(), new StringWriter(), "preflight", "--seconds", "abc"));
        err = new StringWriter();
        assertEquals(2, run(new StringWriter(), err, "preflight", "--seconds", "0.001", "--rounds", "1000"));
        assertTrue(err.toString().contains("--rounds"), err.toString());
    }

    @Test
    void shouldAlternateFloorAndLoopInRounds() throws Exception {
        StringWriter out = new StringWriter();
        int code = run(out, new StringWriter(), "preflight", "--seconds", "0.6", "--rounds", "3", "--json");
        JsonNode j = new ObjectMapper().readTree(out.toString());
        assertEquals(3, j.get("rounds").asInt());
        assertEquals(12_000, j.get("floor").get("ticks").asLong());
        assertEquals(12_000, j.get("loop").get("exchanges").asLong());
        assertEquals(j.get("sustainable").asBoolean() ? 0 : 1, code);
    }
}
