package dev.galebench.e2e.wire;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.galebench.link.BoardLinks;
import dev.galebench.link.LinkOptions;
import dev.galebench.plant.BoardCommand;
import dev.galebench.plant.SensorView;
import dev.galebench.rt.BoardLink;
import dev.galebench.support.PtyPair;
import dev.galebench.support.SensorViews;
import dev.galebench.wire.WireProfile;
import java.io.ByteArrayOutputStream;
import java.io.PrintWriter;
import java.nio.file.Paths;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import picocli.CommandLine;

/** The virtual board as a separate process, spawned the way a user or a test bench would. */
class VirtualBoardProcessTest {
    private static List<String> boardCommand(String... args) {
        final List<String> cmd = new ArrayList<>();
        cmd.add(Paths.get(System.getProperty("java.home"), "bin", "java").toString());
        cmd.add("-cp");
        cmd.add(System.getProperty("java.class.path"));
        cmd.add("dev.galebench.board.VirtualBoardMain");
        cmd.addAll(List.of(args));
        return cmd;
    }

    private static void exchange(BoardLink link, int frames) {
        final SensorView view = new SensorView();
        final BoardCommand out = new BoardCommand();
        for (long seq = 0; seq < frames; seq++) {
            SensorViews.fill(view, seq);
            assertTrue(link.send(seq, view));
            assertEquals(BoardLink.POLL_REPLY, BoardKitUdpExchangeTest.awaitReply(link, out), "reply to " + seq);
            assertEquals(seq, out.answeredSequence);
            assertEquals(0.5, out.mscDutyA, 1e-4, "hold controller: converters blocked");
            assertEquals(BoardCommand.CMD_BREAKER_CLOSE, out.commandFlags, "breaker kept closed as first measured");
        }
    }

    @Test
    void shouldAnswerOverUdpFromItsOwnProcess() throws Exception {
        try (Processes.Child board = new Processes.Child(boardCommand("--udp", "127.0.0.1:0"))) {
            final int port = board.parse("listening on udp 127\\.0\\.0\\.1:(\\d+)");
            try (BoardLink link = BoardLinks.open("udp://127.0.0.1:" + port, LinkOptions.defaults())) {
                exchange(link, 500);
            }
            board.stop();
            assertTrue(board.stderr().contains("answered 500, crc errors 0, malformed 0"), board.stderr());
            assertTrue(board.stderr().contains("controller starts 1"), board.stderr());
        }
    }

    @Test
    void shouldAnswerOverARealPtyPairWithTheCompactProfile() throws Exception {
        try (PtyPair pty = PtyPair.open();
             Processes.Child board = new Processes.Child(boardCommand("--serial", pty.second() + "@921600", "--profile", "compact"))) {
            assertTrue(board.firstLine.contains("profile compact"), board.firstLine);
            try (BoardLink link = BoardLinks.open("serial:" + pty.first() + "@921600",
                    LinkOptions.defaults().profile(WireProfile.COMPACT))) {
                exchange(link, 300);
                assertEquals(300, link.counters().repliesAccepted);
            }
            board.stop();
            assertTrue(board.stderr().contains("answered 300"), board.stderr());
        }
    }

    @Test
    void shouldExitWithUsageCodeOnBadOptions() throws Exception {
        final Process p = new ProcessBuilder(boardCommand("--udp", "127.0.0.1:notaport")).start();
        final String err = new String(p.getErrorStream().readAllBytes());
        assertEquals(2, p.waitFor());
        assertTrue(err.contains("port 'notaport' is not a number"), err);
    }

    @Test
    void shouldBeRegisteredAsGalebenchBoardCommand() {
        final CommandLine cl = dev.galebench.cli.GalebenchCommand.commandLine();
        assertTrue(cl.getSubcommands().containsKey("board"));
        final ByteArrayOutputStream err = new ByteArrayOutputStream();
        cl.setErr(new PrintWriter(err, true));
        assertEquals(2, cl.execute("board", "--udp", "1", "--serial", "/dev/null"));
        assertTrue(err.toString().contains("exactly one of --udp"), err.toString());
        assertEquals(2, cl.execute("board", "--udp", "0", "--controller", "nosuch"));
        assertTrue(err.toString().contains("unknown board controller 'nosuch'"), err.toString());
        assertEquals(2, cl.execute("board", "--udp", "0", "--profile", "tiny"));
        assertTrue(err.toString().contains("unknown wire profile 'tiny'"), err.toString());
    }
}
