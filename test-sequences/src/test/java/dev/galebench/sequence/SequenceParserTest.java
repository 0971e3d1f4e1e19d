package dev.galebench.sequence;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.galebench.testsupport.Layouts;
import dev.galebench.testsupport.SequenceTexts;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.stream.Collectors;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class SequenceParserTest {

    private static SequenceException refuse(String text) {
        return assertThrows(SequenceException.class, () -> SequenceParser.parse("t.yaml", text, null));
    }

    @Test
    void shouldParseEveryLibrarySequenceWithItsFileName() {
        List<String> names = SequenceLibrary.names();
        assertTrue(names.size() >= 12, "at least 12 library sequences, found " + names.size());
        for (String n : names) {
            Sequence s = SequenceLibrary.load(n);
            assertEquals(n, s.name(), "name inside " + n + ".yaml");
            assertTrue(!s.checks().isEmpty() && !s.purpose().isEmpty(), n);
            SequenceChecks.bind(s, Layouts.documented());
        }
    }

    @Test
    void shouldListEveryLibraryFileInTheIndex() throws IOException {
        try (Stream<Path> files = Files.list(Path.of("library"))) {
            List<String> onDisk = files.map(p -> p.getFileName().toString()).filter(f -> f.endsWith(".yaml"))
                    .map(f -> f.substring(0, f.length() - 5)).sorted().collect(Collectors.toList());
            assertEquals(onDisk, SequenceLibrary.names().stream().sorted().collect(Collectors.toList()));
        }
    }

    @Test
    void shouldReadTheFieldsOfAFile() {
        Sequence s = SequenceLibrary.load("dip-3ph-50pct");
        assertEquals(12.0, s.initial().windMPerS());
        assertEquals(50.0, s.stepUs());
        assertEquals(3.0, s.durationS());
        Action.GridVoltageEvent dip = (Action.GridVoltageEvent) s.actions().get(0);
        assertEquals(1.0, dip.atS());
        assertEquals(-0.5, dip.deltaPu()[1]);
        assertEquals(0.65, dip.extentS(), 1e-12);
        assertEquals("library/dip-3ph-50pct.yaml", dip.mark().file());
        assertEquals(12, dip.mark().line());
    }

    @Test
    void shouldGiveLineAndColumnForBadYaml() {
        SequenceException e = refuse("format: 1\nname: x\npurpose: [unclosed\n");
        assertEquals("t.yaml", e.mark().file());
        assertTrue(e.mark().line() >= 3, e.getMessage());
        assertTrue(e.getMessage().startsWith("t.yaml:" + e.mark().line() + ":" + e.mark().column() + ": not valid YAML"),
                e.getMessage());
    }

    @Test
    void shouldRejectUnknownKeyListingTheValidOnes() {
        String text = SequenceTexts.with("  - at_s: 1.0\n    wind_step: {to_ms: 9}\n", SequenceTexts.NO_TRIP);
        SequenceException e = refuse(text);
        assertEquals(9, e.mark().line());
        assertEquals(17, e.mark().column());
        assertTrue(e.reason().contains("unknown key 'to_ms'") && e.reason().contains("valid keys: to_m_s"), e.reason());
    }

    @Test
    void shouldRejectUnknownActionKindListingKinds() {
        SequenceException e = refuse(SequenceTexts.with("  - at_s: 1.0\n    wind_jump: {to_m_s: 9}\n",
                SequenceTexts.NO_TRIP));
        assertEquals(8, e.mark().line());
        assertTrue(e.reason().contains("unknown action 'wind_jump'") && e.reason().contains("grid_dip"), e.reason());
    }

    @Test
    void shouldRejectTextWhereANumberBelongs() {
        SequenceException e = refuse(SequenceTexts.with("  - at_s: 1.0\n    wind_step: {to_m_s: 9ms}\n",
                SequenceTexts.NO_TRIP));
        assertEquals(9, e.mark().line());
        assertTrue(e.reason().contains("must be a number, found '9ms'"), e.reason());
    }

    @Test
    void shouldRejectOverlappingDipsOnTheSameTrack() {
        String actions = "  - at_s: 1.0\n    grid_dip: {depth_pu: 0.5, duration_s: 0.15, recovery_s: 0.5}\n"
                + "  - at_s: 1.5\n    grid_swell: {rise_pu: 0.1, duration_s: 0.1}\n";
        SequenceException e = refuse(SequenceTexts.with(actions, SequenceTexts.NO_TRIP));
        assertEquals(10, e.mark().line());
        assertTrue(e.reason().contains("overlaps grid_dip at 1 s (line 8, acting until 1.65 s)"), e.reason());
    }

    @Test
    void shouldRejectTwoStepsAtTheSameInstant() {
        String actions = "  - at_s: 1.0\n    wind_step: {to_m_s: 9}\n  - at_s: 1.0\n    wind_step: {to_m_s: 8}\n";
        SequenceException e = refuse(SequenceTexts.with(actions, SequenceTexts.NO_TRIP));
        assertTrue(e.reason().contains("overlaps"), e.reason());
    }

    @Test
    void shouldAllowAGustOnTopOfAWindRamp() {
        String actions = "  - at_s: 0.5\n    wind_ramp: {to_m_s: 12, duration_s: 2}\n"
                + "  - at_s: 1.0\n    wind_gust: {amplitude_m_s: 2, duration_s: 1.5}\n";
        Sequence s = SequenceParser.parse("t.yaml", SequenceTexts.with(actions, SequenceTexts.NO_TRIP), null);
        assertEquals(2, s.actions().size());
    }

    @Test
    void shouldRejectAnActionThatOutlastsTheRun() {
        SequenceException e = refuse(SequenceTexts.with(
                "  - at_s: 2.5\n    grid_dip: {depth_pu: 0.5, duration_s: 0.4, recovery_s: 0.2}\n", SequenceTexts.NO_TRIP));
        assertTrue(e.reason().contains("acts until 3.1 s, after the end of the run (3 s)"), e.reason());
    }

    @Test
    void shouldRejectACheckWindowOutsideTheRun() {
        SequenceException e = refuse(SequenceTexts.with("  - at_s: 1.0\n    wind_step: {to_m_s: 9}\n",
                "  - name: b\n    band: {signal: v_dc_v, high: 1200, to_s: 4}\n"));
        assertEquals(12, e.mark().line());
        assertTrue(e.reason().contains("'to_s'") && e.reason().contains("must be within 0 .. 3 s"), e.reason());
    }

    @Test
    void shouldRejectADuplicateCheckName() {
        SequenceException e = refuse(SequenceTexts.with("", SequenceTexts.NO_TRIP + SequenceTexts.NO_TRIP));
        assertTrue(e.reason().contains("check name 'no-trip' is used twice"), e.reason());
    }

    @Test
    void shouldRejectAnUnknownSignalListingTheValidOnes() {
        Sequence s = SequenceParser.parse("t.yaml", SequenceTexts.with("",
                "  - name: b\n    band: {signal: v_dc, high: 1200}\n"), null);
        SequenceException e = assertThrows(SequenceException.class, () -> SequenceChecks.bind(s, Layouts.documented()));
        assertEquals(new SourceMark("t.yaml", 10, 20), e.mark());
        assertTrue(e.reason().contains("unknown signal 'v_dc'") && e.reason().contains("valid signals: wind_m_s,")
                && e.reason().contains("v_dc_v"), e.reason());
    }

    @Test
    void shouldRejectAnImpossibleFrequencyRamp() {
        String text = SequenceTexts.with("  - at_s: 0.5\n    frequency_step: {to_hz: 50}\n"
                + "  - at_s: 1.0\n    frequency_ramp: {to_hz: 50, rate_hz_s: 1}\n", SequenceTexts.NO_TRIP);
        SequenceException e = refuse(text);
        assertTrue(e.reason().contains("the frequency is already 50 Hz"), e.reason());
    }

    @Test
    void shouldNameTheMissingFile(@TempDir Path dir) {
        SequenceException e = assertThrows(SequenceException.class,
                () -> SequenceParser.parseFile(dir.resolve("nope.yaml")));
        assertTrue(e.getMessage().endsWith("nope.yaml:1:1: no such file"), e.getMessage());
    }

    @Test
    void shouldResolveRelativePathsAgainstTheFile(@TempDir Path dir) throws IOException {
        Path f = dir.resolve("mine.yaml");
        Files.writeString(f, SequenceTexts.with("", SequenceTexts.NO_TRIP));
        Sequence s = SequenceLibrary.resolve(f.toString());
        assertEquals(dir.toAbsolutePath(), s.baseDir());
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> SequenceLibrary.resolve("no-such-sequence"));
        assertTrue(e.getMessage().contains("dip-3ph-50pct"), e.getMessage());
    }
}
