package dev.galebench.plant.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.galebench.plant.SteadyState;
import dev.galebench.plant.TurbineFile;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import picocli.CommandLine;

class TurbineCommandTest {
    private final StringWriter out = new StringWriter();
    private final StringWriter err = new StringWriter();

    private int run(String... args) {
        CommandLine cl = new CommandLine(new TurbineCommand());
        cl.setOut(new PrintWriter(out, true));
        cl.setErr(new PrintWriter(err, true));
        return cl.execute(args);
    }

    @Test
    void shouldPrintEveryParameterWithItsUnit() {
        assertEquals(0, run("show"));
        String text = out.toString();
        for (TurbineFile.Key k : TurbineFile.keys()) {
            assertTrue(text.contains(k.name()), k.name());
        }
        assertTrue(text.contains("kg/m3"));
        assertTrue(text.contains("specific_rating_w_m2"));
    }

    @Test
    void shouldPrintParametersAsJson() throws Exception {
        assertEquals(0, run("show", "--json"));
        JsonNode root = new ObjectMapper().readTree(out.toString());
        assertEquals(58.0, root.path("parameters").path("rotor.radius_m").path("value").asDouble(), 0.0);
        assertEquals("m", root.path("parameters").path("rotor.radius_m").path("unit").asText());
        assertEquals(TurbineFile.keys().size(), root.path("parameters").size());
    }

    @Test
    void shouldPrintTheSettledPointAsJsonWithTheContractKeys() throws Exception {
        assertEquals(0, run("steady", "--wind", "8", "--q-pu", "0.1", "--json"));
        JsonNode n = new ObjectMapper().readTree(out.toString());
        for (String key : new String[] {"wind_m_s", "rotor_speed_rad_s", "tip_speed_ratio", "cp", "pitch_deg", "p_aero_w",
            "p_grid_w", "q_grid_var", "losses_w", "v_dc_v", "rotor_radius_m", "air_density_kg_m3"}) {
            assertTrue(n.has(key), key);
        }
        var op = SteadyState.solve(TurbineFile.defaults(), 8, 1.0, 0.1);
        assertEquals(op.gridPowerW, n.get("p_grid_w").asDouble(), 1e-6);
        assertEquals(0.1 * 4.0e6, n.get("q_grid_var").asDouble(), 1e-3);
    }

    @Test
    void shouldHoldTheTerminalVoltageWhenAsked() throws Exception {
        assertEquals(0, run("steady", "--wind", "12", "--terminal-voltage", "1.02", "--json"));
        JsonNode n = new ObjectMapper().readTree(out.toString());
        assertEquals(1.02, n.get("v_term_pu").asDouble(), 1e-9);
    }

    @Test
    void shouldExitTwoWithAClearMessageOnBadWind() {
        assertEquals(2, run("steady", "--wind", "-3"));
        assertTrue(err.toString().contains("wind: must be within 0..60 m/s"), err.toString());
    }

    @Test
    void shouldExitTwoOnAMissingOption() {
        assertEquals(2, run("steady"));
        assertTrue(err.toString().contains("--wind"), err.toString());
    }

    @Test
    void shouldExitTwoNamingFileLineAndKeyOfABadTurbineFile(@TempDir Path dir) throws Exception {
        Path f = dir.resolve("t.yaml");
        Files.writeString(f, "rotor:\n  radius_m: -5\n");
        assertEquals(2, run("show", "--turbine", f.toString()));
        String e = err.toString();
        assertTrue(e.contains(f + ":2: rotor.radius_m: out of range"), e);
        assertTrue(e.contains(f + ": rotor.air_density_kg_m3: missing"), e);
    }
}
