package dev.galebench.e2e.wire;

import dev.galebench.runner.SequenceRunner;
import dev.galebench.sequence.Sequence;
import dev.galebench.sequence.SequenceLibrary;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.Paths;
import java.util.ArrayList;
import java.util.List;

import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * Every library sequence in real time over UDP loopback against the virtual board in its own
 * process (the reference controller), paced exchange as in {@code galebench demo}. Several
 * minutes of wall time, so it runs in the soak profile: {@code mvn -P soak verify -pl tests -am
 * -Dtest=LibraryOverUdpSoakTest}. Verdicts only; timing figures go to each run's report.
 */
@Tag("soak")
class LibraryOverUdpSoakTest {
    @Test
    void shouldPassEveryLibrarySequenceInRealTimeOverUdp() throws Exception {
        final Path out = Files.createDirectories(Paths.get("target", "library-over-udp"));
        final List<String> failed = new ArrayList<>();
        final StringBuilder table = new StringBuilder();
        for (String name : SequenceLibrary.names()) {
            final Sequence seq = SequenceLibrary.load(name);
            final double periodUs = seq.stepUs() * seq.exchangeEvery();
            final List<String> cmd = List.of(Paths.get(System.getProperty("java.home"), "bin", "java").toString(),
                    "-Xms64m", "-Xmx256m", "-cp", System.getProperty("java.class.path"),
                    "dev.galebench.board.VirtualBoardMain", "--udp", "127.0.0.1:0", "--controller", "reference",
                    "--period-us", Double.toString(periodUs));
            try (Processes.Child board = new Processes.Child(cmd)) {
                final int port = board.parse("listening on udp 127\\.0\\.0\\.1:(\\d+)");
                final SequenceRunner.Options o = new SequenceRunner.Options();
                o.board = "udp://127.0.0.1:" + port;
                o.outBase = out;
                o.progress = false;
                o.replyWaitUs = 20_000;
                final ByteArrayOutputStream log = new ByteArrayOutputStream();
                o.err = new PrintStream(log, true, StandardCharsets.UTF_8);
                final SequenceRunner.Result r = new SequenceRunner().run(seq, o);
                table.append(String.format(java.util.Locale.ROOT, "%-28s %s  exchanges %d, overruns %d, missing %d%n",
                        name, r.passed() ? "PASS" : "FAIL", r.loop().exchanges, r.loop().overruns,
                        r.loop().linkCounters.missingReplies));
                if (!r.passed()) {
                    failed.add(name + " (" + r.folder() + ")");
                }
                board.stop();
            }
        }
        System.out.print(table);
        Files.writeString(out.resolve("verdicts.txt"), table);
        assertTrue(failed.isEmpty(), "failed in real time over UDP: " + failed + "\n" + table);
    }
}
