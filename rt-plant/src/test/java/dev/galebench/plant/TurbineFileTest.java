package dev.galebench.plant;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class TurbineFileTest {

    static String defaultText() throws IOException {
        try (InputStream in = TurbineFile.class.getResourceAsStream("default-turbine.yaml")) {
            return new String(in.readAllBytes(), StandardCharsets.UTF_8);
        }
    }

    @Test
    void shouldLoadEveryKeyOfTheDefaultTurbine() {
        TurbineParameters p = TurbineFile.defaults();
        assertEquals(TurbineFile.keys().size(), p.values().size());
        assertEquals(58.0, p.rotorRadiusM, 0.0);
        assertEquals(60, p.polePairs);
        assertTrue(p.twoMass);
        assertEquals(0.0068, p.cpC7, 0.0);
    }

    @Test
    void shouldLoadTheSameTurbineFromJsonWithFlatKeys(@TempDir Path dir) throws IOException {
        StringBuilder json = new StringBuilder("{\n");
        TurbineParameters d = TurbineFile.defaults();
        int i = 0;
        for (TurbineFile.Key k : TurbineFile.keys()) {
            json.append("  \"").append(k.name()).append("\": ").append(d.values().get(k.name()));
            json.append(++i < TurbineFile.keys().size() ? ",\n" : "\n");
        }
        json.append("}\n");
        Path f = dir.resolve("t.json");
        Files.writeString(f, json);
        assertEquals(d.values(), TurbineFile.load(f).values());
    }

    @Test
    void shouldReportEveryProblemWithFileLineKeyAndReason(@TempDir Path dir) throws IOException {
        String text = defaultText()
                .replace("radius_m: 58.0", "radius_m: fifty")
                .replace("pole_pairs: 60", "pole_pairs: 60.5")
                .replace("  cut_out_wind_m_s: 25.0\n", "  cut_out_wind_m_s: 25.0\n  cut_out_wnd_m_s: 25.0\n")
                .replace("  x_over_r: 10.0\n", "");
        Path f = dir.resolve("bad.yaml");
        Files.writeString(f, text);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> TurbineFile.load(f));
        String m = e.getMessage();
        int radiusLine = lineOf(text, "radius_m: fifty");
        int typoLine = lineOf(text, "cut_out_wnd_m_s");
        assertTrue(m.contains(f + ":" + radiusLine + ": rotor.radius_m: expected a number, found 'fifty'"), m);
        assertTrue(m.contains(f + ":" + typoLine + ": rotor.cut_out_wnd_m_s: unknown parameter"), m);
        assertTrue(m.contains(f + ": grid.x_over_r: missing"), m);
        assertTrue(m.contains(f + ":" + lineOf(text, "pole_pairs: 60.5") + ": generator.pole_pairs: must be a whole number"), m);
        assertEquals(4, m.split("\n").length, m);
    }

    @Test
    void shouldRejectPhysicallyInconsistentValuesWithTheirLines(@TempDir Path dir) throws IOException {
        String text = defaultText()
                .replace("nominal_voltage_v: 1100.0", "nominal_voltage_v: 900.0")
                .replace("rated_wind_m_s: 10.9", "rated_wind_m_s: 9.0")
                .replace("cp_c1: 0.5176", "cp_c1: 0.9");
        Path f = dir.resolve("inconsistent.yaml");
        Files.writeString(f, text);
        String m = assertThrows(IllegalArgumentException.class, () -> TurbineFile.load(f)).getMessage();
        assertTrue(m.contains(f + ":" + lineOf(text, "nominal_voltage_v: 900.0") + ": dc_link.nominal_voltage_v: below the line-to-line peak"), m);
        assertTrue(m.contains(f + ":" + lineOf(text, "cp_c1: 0.9") + ": rotor.cp_c1: Cp surface maximum"), m);
        assertTrue(m.contains("Betz"), m);
    }

    @Test
    void shouldRejectOutOfRangeValues(@TempDir Path dir) throws IOException {
        String text = defaultText().replace("two_mass: 1", "two_mass: 2").replace("capacitance_f: 0.033", "capacitance_f: -0.033");
        Path f = dir.resolve("range.yaml");
        Files.writeString(f, text);
        String m = assertThrows(IllegalArgumentException.class, () -> TurbineFile.load(f)).getMessage();
        assertTrue(m.contains(":" + lineOf(text, "two_mass: 2") + ": drivetrain.two_mass: out of range"), m);
        assertTrue(m.contains(":" + lineOf(text, "capacitance_f: -0.033") + ": dc_link.capacitance_f: out of range"), m);
    }

    @Test
    void shouldReportSyntaxErrorsWithTheirLine(@TempDir Path dir) throws IOException {
        Path f = dir.resolve("syntax.yaml");
        Files.writeString(f, "rotor:\n  radius_m: [1, 2\n");
        String m = assertThrows(IllegalArgumentException.class, () -> TurbineFile.load(f)).getMessage();
        assertTrue(m.startsWith(f + ":"), m);
        assertTrue(m.contains("(syntax)"), m);
    }

    static int lineOf(String text, String needle) {
        String before = text.substring(0, text.indexOf(needle));
        return (int) before.chars().filter(c -> c == '\n').count() + 1;
    }
}
