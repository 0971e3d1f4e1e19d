package dev.galebench.board.control;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.galebench.plant.TurbineFile;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import picocli.CommandLine;

class ControllerCommandTest {
    private final StringWriter out = new StringWriter();
    private final StringWriter err = new StringWriter();

    private int run(String... args) {
        final CommandLine cl = new CommandLine(new ControllerCommand());
        cl.setOut(new PrintWriter(out, true));
        cl.setErr(new PrintWriter(err, true));
        return cl.execute(args);
    }

    @Test
    void shouldPrintTheContractKeysAsJson() throws Exception {
        assertEquals(0, run("show", "--json"));
        final JsonNode root = new ObjectMapper().readTree(out.toString());
        for (String conv : new String[] {"msc", "gsc"}) {
            final JsonNode c = root.path(conv).path("current");
            for (String k : new String[] {"kp", "ki", "rise_time_s", "r_ohm", "l_h"}) {
                assertTrue(c.path(k).isNumber(), conv + ".current." + k);
            }
        }
        assertTrue(root.path("gsc").path("dc_voltage").path("kp").isNumber());
        assertTrue(root.path("gsc").path("dc_voltage").path("ki").isNumber());
        assertTrue(root.path("pll").path("kp").isNumber());
        assertTrue(root.path("pll").path("ki").isNumber());
        // IMC: Kp = alpha L, Ki = alpha R with alpha = ln 9 / t_rise (Harnefors & Nee 1998)
        final JsonNode msc = root.path("msc").path("current");
        final double alpha = Math.log(9) / msc.path("rise_time_s").asDouble();
        assertEquals(alpha * TurbineFile.defaults().qAxisInductanceH, msc.path("kp").asDouble(), 1e-12);
        assertEquals(alpha * TurbineFile.defaults().statorResistanceOhm, msc.path("ki").asDouble(), 1e-12);
        assertEquals(0.010, root.path("gsc").path("current").path("rise_time_s").asDouble(), 0.0);
    }

    @Test
    void shouldUseTheControllerFileGiven(@TempDir Path dir) throws Exception {
        final Path f = dir.resolve("c.yaml");
        Files.writeString(f, "gsc:\n  current_rise_time_s: 0.005\n");
        assertEquals(0, run("show", "--controller", f.toString(), "--json"));
        final JsonNode gsc = new ObjectMapper().readTree(out.toString()).path("gsc").path("current");
        assertEquals(0.005, gsc.path("rise_time_s").asDouble(), 0.0);
        assertEquals(Math.log(9) / 0.005 * gsc.path("l_h").asDouble(), gsc.path("kp").asDouble(), 1e-12);
    }

    @Test
    void shouldPrintAReadableTable() {
        assertEquals(0, run("show"));
        assertTrue(out.toString().contains("gsc.current.kp"), out.toString());
        assertTrue(out.toString().contains("pll.ki"));
        assertTrue(out.toString().contains("frt.negative_sequence_k"), out.toString());
        assertTrue(out.toString().contains("gsc.negative_sequence_current.kp"), out.toString());
    }

    @Test
    void shouldPrintTheNegativeSequenceSetting(@TempDir Path dir) throws Exception {
        final Path f = dir.resolve("c.yaml");
        Files.writeString(f, "frt:\n  negative_sequence_k: 0\n");
        assertEquals(0, run("show", "--controller", f.toString(), "--json"));
        final JsonNode root = new ObjectMapper().readTree(out.toString());
        assertEquals(0.0, root.path("frt").path("negative_sequence_k").asDouble(-1), 0.0);
        final JsonNode neg = root.path("gsc").path("negative_sequence_current");
        // alpha2 = ln9 / (2 t_r), Kp = alpha2 L_tot, Ki = alpha2^2 L_tot / 4 (ControllerTuning)
        final double a2 = Math.log(9) / (2 * 0.010);
        final double l = root.path("gsc").path("current").path("l_h").asDouble();
        assertEquals(a2 * l, neg.path("kp").asDouble(), 1e-12);
        assertEquals(0.25 * a2 * a2 * l, neg.path("ki").asDouble(), 1e-12);
    }

    @Test
    void shouldExitTwoNamingFileLineAndKey(@TempDir Path dir) throws Exception {
        final Path f = dir.resolve("c.yaml");
        Files.writeString(f, "pll:\n  natural_frequency_hz: fast\n");
        assertEquals(2, run("show", "--controller", f.toString()));
        assertTrue(err.toString().contains(f + ":2: pll.natural_frequency_hz: not a number"), err.toString());
        assertEquals(2, run("show", "--turbine", dir.resolve("missing.yaml").toString()));
    }
}
