package dev.galebench.runner;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.galebench.cli.GalebenchCommand;
import dev.galebench.sequence.SequenceLibrary;
import java.io.PrintWriter;
import java.io.StringWriter;
import org.junit.jupiter.api.Test;
import picocli.CommandLine;

class SequencesCommandTest {

    private static String[] run(int expectedExit, String... args) {
        CommandLine cl = GalebenchCommand.commandLine();
        StringWriter out = new StringWriter(), err = new StringWriter();
        cl.setOut(new PrintWriter(out));
        cl.setErr(new PrintWriter(err));
        int code = cl.execute(args);
        assertEquals(expectedExit, code, err.toString());
        return new String[] {out.toString(), err.toString()};
    }

    @Test
    void shouldListTheLibraryOneLineEach() {
        String out = run(0, "sequences")[0];
        String[] lines = out.strip().split("\n");
        assertEquals(SequenceLibrary.names().size(), lines.length, out);
        assertTrue(lines[0].startsWith("wind-step-partial-load "), lines[0]);
        assertTrue(out.contains("dip-3ph-50pct ") && out.contains("3.0 s"), out);
    }

    @Test
    void shouldListTheLibraryAsJsonObjectsWithNameAndFile() throws Exception {
        JsonNode arr = new ObjectMapper().readTree(run(0, "sequences", "--json")[0]);
        assertTrue(arr.isArray());
        assertEquals(SequenceLibrary.names().size(), arr.size());
        for (JsonNode o : arr) {
            String name = o.get("name").asText();
            assertEquals("library/" + name + ".yaml", o.get("file").asText());
            assertTrue(o.get("checks").asInt() > 0, name);
        }
    }

    @Test
    void shouldRefuseAnUnknownOptionWithExitCodeTwo() {
        String err = run(2, "sequences", "--yaml")[1];
        assertTrue(err.contains("Unknown option: '--yaml'"), err);
    }
}
