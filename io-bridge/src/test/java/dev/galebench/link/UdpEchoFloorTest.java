package dev.galebench.link;

import dev.galebench.rt.SpinFloor;
import org.junit.jupiter.api.Test;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** The I/O floor's echo over real loopback sockets: every tick sends, the echo thread answers. */
class UdpEchoFloorTest {

    @Test
    void shouldSendOneDatagramPerTickAndReceiveTheEchoes() throws Exception {
        try (UdpEchoFloor echo = new UdpEchoFloor(128)) {
            SpinFloor.Result r = SpinFloor.measure(200_000, 200_000_000, -1, echo);
            assertEquals(1000, r.ticks());
            assertEquals(1000, echo.sent(), "one datagram per tick");
            // the echo of the last tick may still be in flight; on a machine stalled for all
            // of the last ticks more may be: at least most come back
            assertTrue(echo.echoed() >= 900 && echo.echoed() <= 1000, "echoes " + echo.echoed());
        }
    }

    @Test
    void shouldRejectAFrameSizeOutOfRange() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> new UdpEchoFloor(4));
        assertTrue(e.getMessage().contains("4 bytes"), e.getMessage());
    }
}
