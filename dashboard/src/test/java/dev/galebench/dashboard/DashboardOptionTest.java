package dev.galebench.dashboard;

import com.fasterxml.jackson.databind.JsonNode;
import dev.galebench.dashboard.support.ConsoleClient;
import org.junit.jupiter.api.Test;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.util.concurrent.atomic.AtomicInteger;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** The {@code --dashboard[=PORT]} mixin and the watch-only bench of scripted runs. */
class DashboardOptionTest {
    @Command(name = "run")
    static final class RunLike {
        @Mixin
        DashboardOption dashboard;
    }

    private static DashboardOption parse(String... args) {
        RunLike r = new RunLike();
        new CommandLine(r).parseArgs(args);
        return r.dashboard;
    }

    @Test
    void shouldBeOffUnlessGivenAndUseTheDefaultPortWithoutValue() {
        assertFalse(parse().asked());
        assertNull(parse().startIfAsked(null, null, null));
        assertEquals(DashboardOptions.DEFAULT_PORT, parse("--dashboard").port());
        assertEquals(9123, parse("--dashboard=9123").port());
    }

    @Test
    void shouldStartALoopbackConsoleThatOnlyWatchesAndAborts() throws Exception {
        AtomicInteger aborts = new AtomicInteger();
        StringWriter printed = new StringWriter();
        try (Dashboard d = parse("--dashboard=0").startIfAsked(BenchControl.watchOnly("dip-3ph-deep", aborts::incrementAndGet), null,
                new PrintWriter(printed))) {
            assertTrue(printed.toString().startsWith("live console: http://127.0.0.1:" + d.port() + "/"), printed.toString());
            try (ConsoleClient c = ConsoleClient.open(d.port(), "")) {
                assertEquals("control", c.await("hello").get("role").asText());
                assertFalse(c.await("controls").get("interactive").asBoolean());
                assertEquals("dip-3ph-deep", c.await("sequences").get("sequences").get(0).get("name").asText());
                c.send("{\"type\":\"control\",\"id\":1,\"action\":\"start\",\"sequence\":\"dip-3ph-deep\"}");
                assertFalse(c.await("ack").get("accepted").asBoolean());
                c.send("{\"type\":\"control\",\"id\":2,\"action\":\"abort\"}");
                JsonNode ack = c.await("ack");
                assertTrue(ack.get("accepted").asBoolean(), ack.toString());
                c.send("{\"type\":\"control\",\"id\":3,\"action\":\"abort\"}");
                assertFalse(c.await("ack").get("accepted").asBoolean());
            }
        }
        assertEquals(1, aborts.get());
    }
}
