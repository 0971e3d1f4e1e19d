package dev.galebench.board.control;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class ControllerFileTest {
    @TempDir
    Path dir;

    private Path write(String text) throws IOException {
        final Path f = dir.resolve("ctl.yaml");
        Files.writeString(f, text);
        return f;
    }

    @Test
    void shouldLoadTheShippedDefaults() {
        final ControllerSettings s = ControllerFile.defaults();
        assertEquals(0.020, s.mscCurrentRiseTimeS);
        assertEquals(0.010, s.gscCurrentRiseTimeS);
        assertEquals(2.0, s.kFactor);
        assertEquals(1.10, s.chopperOnPu);
    }

    @Test
    void shouldOverrideOnlyTheKeysInTheUserFile() throws IOException {
        final ControllerSettings s = ControllerFile.load(write("frt:\n  k_factor: 3.5\ngsc:\n  current_rise_time_s: 0.005\n"));
        assertEquals(3.5, s.kFactor);
        assertEquals(0.005, s.gscCurrentRiseTimeS);
        assertEquals(0.020, s.mscCurrentRiseTimeS);
    }

    @Test
    void shouldReportEveryProblemWithFileLineAndKey() throws IOException {
        final Path f = write("frt:\n  k_factor: lots\n  kfactor: 2\ngsc:\n  current_rise_time_s: -1\n");
        final IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> ControllerFile.load(f));
        final String m = e.getMessage();
        assertTrue(m.contains(f + ":2: frt.k_factor: not a number"), m);
        assertTrue(m.contains(f + ":3: frt.kfactor: unknown key"), m);
        assertTrue(m.contains(f + ":5: gsc.current_rise_time_s: -1.0 is outside"), m);
    }

    @Test
    void shouldReadTheNegativeSequenceKFactorAndRejectBadValues() throws IOException {
        assertEquals(2.0, ControllerFile.defaults().negativeSequenceK, "default like the positive k");
        assertEquals(0.0, ControllerFile.load(write("frt:\n  negative_sequence_k: 0\n")).negativeSequenceK);
        final Path f = write("frt:\n  k_factor: 2\n  negative_sequence_k: -1\n");
        final IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> ControllerFile.load(f));
        assertTrue(e.getMessage().contains(f + ":3: frt.negative_sequence_k: -1.0 is outside [0.0, 10.0]"), e.getMessage());
        final Path g = write("frt:\n  negative_sequence_k: strong\n");
        final IllegalArgumentException e2 = assertThrows(IllegalArgumentException.class, () -> ControllerFile.load(g));
        assertTrue(e2.getMessage().contains(g + ":2: frt.negative_sequence_k: not a number: 'strong'"), e2.getMessage());
    }

    @Test
    void shouldRejectInconsistentThresholds() throws IOException {
        final Path f = write("frt:\n  exit_deviation_pu: 0.12\nchopper:\n  off_pu: 1.2\n");
        final IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> ControllerFile.load(f));
        assertTrue(e.getMessage().contains(f + ":2: frt.exit_deviation_pu"), e.getMessage());
        assertTrue(e.getMessage().contains(f + ":4: chopper.off_pu"), e.getMessage());
    }

    @Test
    void shouldRejectAMissingFileAndBrokenYaml() throws IOException {
        final IllegalArgumentException missing = assertThrows(IllegalArgumentException.class,
                () -> ControllerFile.load(dir.resolve("nope.yaml")));
        assertTrue(missing.getMessage().contains("no such controller file"));
        final Path f = write("frt: [1, 2\n");
        final IllegalArgumentException broken = assertThrows(IllegalArgumentException.class, () -> ControllerFile.load(f));
        assertTrue(broken.getMessage().startsWith(f + ": not valid YAML"), broken.getMessage());
    }
}
