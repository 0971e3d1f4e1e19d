package dev.galebench.link;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.galebench.board.HoldController;
import dev.galebench.plant.BoardCommand;
import dev.galebench.rt.BoardLink;
import dev.galebench.support.SensorViews;
import java.io.UncheckedIOException;
import org.junit.jupiter.api.Test;

class BoardLinksTest {
    private static String problem(String uri) {
        return assertThrows(IllegalArgumentException.class, () -> BoardLinks.open(uri, LinkOptions.defaults())).getMessage();
    }

    @Test
    void shouldNameTheProblemOfABadUri() {
        assertTrue(problem("").contains("URI is empty"));
        assertTrue(problem("tcp://127.0.0.1:1").contains("'tcp://127.0.0.1:1': unknown scheme"));
        assertTrue(problem("udp://127.0.0.1").contains("expected udp://HOST:PORT"));
        assertTrue(problem("udp://127.0.0.1:70000").contains("port 70000 is not in 1..65535"));
        assertTrue(problem("udp://127.0.0.1:abc").contains("port 'abc' is not a number"));
        assertTrue(problem("serial:@9600").contains("no serial device given"));
        assertTrue(problem("serial:/dev/ttyS0@fast").contains("baud 'fast' is not a number"));
    }

    @Test
    void shouldNameTheDeviceThatCannotBeOpened() {
        final UncheckedIOException e = assertThrows(UncheckedIOException.class,
                () -> BoardLinks.open("serial:/dev/galebench-no-such-port@115200", LinkOptions.defaults()));
        assertTrue(e.getMessage().contains("/dev/galebench-no-such-port"), e.getMessage());
    }

    @Test
    void shouldRejectBadOptionsWhenTheyAreSet() {
        assertThrows(IllegalArgumentException.class, () -> LinkOptions.defaults().localPort(70000));
        assertThrows(IllegalArgumentException.class, () -> LinkOptions.defaults().socketBufferBytes(10));
        assertThrows(IllegalArgumentException.class, () -> LinkOptions.defaults().defaultBaud(0));
        assertThrows(IllegalArgumentException.class, () -> LinkOptions.defaults().profile(null));
    }

    @Test
    void shouldCountSendFailuresWhenInProcessRepliesAreNeverPolled() {
        final HoldController controller = new HoldController();
        controller.setSamplePeriod(50e-6);
        try (BoardLink link = BoardLinks.inProcess(controller)) {
            for (long seq = 0; seq < 10; seq++) {
                link.send(seq, SensorViews.sample(seq));
            }
            assertEquals(8, link.counters().framesSent, "the reply queue holds 8");
            assertEquals(2, link.counters().sendFailures);
            final BoardCommand out = new BoardCommand();
            int replies = 0;
            while (link.poll(out) == BoardLink.POLL_REPLY) {
                replies++;
            }
            assertEquals(8, replies);
            assertEquals(7, out.answeredSequence, "replies come in order; the last queued answers frame 7");
            assertEquals(50e-6, controller.samplePeriodS());
        }
    }
}
