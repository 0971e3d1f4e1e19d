package dev.galebench.board.control;

import java.io.IOException;
import java.io.InputStream;
import java.io.InputStreamReader;
import java.io.Reader;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.yaml.snakeyaml.LoaderOptions;
import org.yaml.snakeyaml.Yaml;
import org.yaml.snakeyaml.error.YAMLException;
import org.yaml.snakeyaml.nodes.MappingNode;
import org.yaml.snakeyaml.nodes.Node;
import org.yaml.snakeyaml.nodes.NodeTuple;
import org.yaml.snakeyaml.nodes.ScalarNode;

/**
 * Loads the controller file (YAML, two levels: {@code section: {key_unit: number}}). A user file
 * may set any subset of the keys; the others come from the shipped
 * {@code default-controller.yaml}. Every problem is collected and reported at once as
 * {@code file:line: key: reason} in one {@link IllegalArgumentException}: unknown keys, values
 * that are not numbers, values out of range, inconsistent pairs (an exit threshold above the
 * entry threshold, a chopper that switches off above its switch-on level, ...).
 */
public final class ControllerFile {
    /** Classpath location of the shipped defaults. */
    public static final String DEFAULT_RESOURCE = "/dev/galebench/board/control/default-controller.yaml";

    private static final double POS = Double.MIN_VALUE;

    /** Allowed range per key, inclusive; POS as a minimum means "strictly positive". */
    private static final Map<String, double[]> RANGES = new LinkedHashMap<>();

    static {
        r("msc.current_rise_time_s", 1e-4, 1.0);
        r("msc.current_limit_pu", 0.1, 3.0);
        r("msc.speed_filter_s", 0.0, 10.0);
        r("msc.torque_transition_speed_pu", 0.5, 1.0);
        r("gsc.current_rise_time_s", 1e-4, 1.0);
        r("gsc.current_limit_pu", 0.1, 3.0);
        r("gsc.current_limit_frt_pu", 0.1, 3.0);
        r("gsc.feed_forward_filter_s", 0.0, 0.1);
        r("gsc.modulation_limit_pu", 0.5, 1.0);
        r("dc_voltage.reference_pu", 0.5, 1.5);
        r("dc_voltage.natural_frequency_hz", 0.1, 500.0);
        r("dc_voltage.damping_ratio", 0.1, 5.0);
        r("dc_voltage.filter_s", 0.0, 0.1);
        r("reactive.voltage_gain_pu", 0.0, 50.0);
        r("reactive.voltage_filter_s", 0.0, 1.0);
        r("reactive.reference_filter_s", POS, 3600.0);
        r("pll.natural_frequency_hz", 0.1, 500.0);
        r("pll.damping_ratio", 0.1, 5.0);
        r("pll.normalisation_floor_pu", 0.01, 1.0);
        r("frt.enter_deviation_pu", 0.01, 0.5);
        r("frt.exit_deviation_pu", 0.0, 0.5);
        r("frt.hold_s", 0.0, 10.0);
        r("frt.k_factor", 0.0, 10.0);
        r("frt.negative_sequence_k", 0.0, 10.0);
        r("frt.active_recovery_rate_pu_s", POS, 1000.0);
        r("chopper.on_pu", 1.0, 2.0);
        r("chopper.off_pu", 0.9, 2.0);
        r("pitch.natural_frequency_hz", 0.001, 10.0);
        r("pitch.damping_ratio", 0.1, 5.0);
        r("protection.undervoltage_pu", 0.0, 1.0);
        r("protection.undervoltage_delay_s", 0.0, 3600.0);
        r("protection.undervoltage_fast_pu", 0.0, 1.0);
        r("protection.undervoltage_fast_delay_s", 0.0, 3600.0);
        r("protection.overvoltage_pu", 1.0, 2.0);
        r("protection.overvoltage_delay_s", 0.0, 3600.0);
        r("protection.overvoltage_fast_pu", 1.0, 2.0);
        r("protection.overvoltage_fast_delay_s", 0.0, 3600.0);
        r("protection.overcurrent_pu", 0.1, 1.0);
        r("protection.overcurrent_delay_s", 0.0, 1.0);
        r("protection.dc_overvoltage_pu", 0.5, 1.0);
        r("protection.dc_overvoltage_delay_s", 0.0, 1.0);
        r("protection.wind_filter_s", 0.0, 600.0);
        r("protection.cut_out_delay_s", 0.0, 3600.0);
        r("protection.cut_in_delay_s", 0.0, 3600.0);
        r("protection.restart_hysteresis_m_s", 0.0, 20.0);
        r("timing.angle_advance_samples", 0.0, 5.0);
    }

    private static void r(String key, double min, double max) {
        RANGES.put(key, new double[] {min, max});
    }

    private ControllerFile() {
    }

    /** The shipped defaults. */
    public static ControllerSettings defaults() {
        return build(defaultValues(), new LinkedHashMap<>(), "default-controller.yaml");
    }

    /** Loads {@code file} over the defaults; {@code null} means defaults only. */
    public static ControllerSettings load(Path file) {
        if (file == null) {
            return defaults();
        }
        final String name = file.toString();
        final Map<String, Double> values = defaultValues();
        final Map<String, Integer> lines = new LinkedHashMap<>();
        final List<String> problems = new ArrayList<>();
        try (Reader in = Files.newBufferedReader(file, StandardCharsets.UTF_8)) {
            readInto(in, name, values, lines, problems, true);
        } catch (NoSuchFileException e) {
            throw new IllegalArgumentException(name + ": no such controller file");
        } catch (IOException e) {
            throw new UncheckedIOException(name + ": cannot read controller file: " + e.getMessage(), e);
        }
        if (!problems.isEmpty()) {
            throw new IllegalArgumentException(String.join("\n", problems));
        }
        return build(values, lines, name);
    }

    /** The keys a controller file may contain, in file order. */
    public static List<String> keys() {
        return new ArrayList<>(RANGES.keySet());
    }

    private static Map<String, Double> defaultValues() {
        final Map<String, Double> values = new LinkedHashMap<>();
        final List<String> problems = new ArrayList<>();
        try (InputStream s = ControllerFile.class.getResourceAsStream(DEFAULT_RESOURCE)) {
            if (s == null) {
                throw new IllegalStateException("missing resource " + DEFAULT_RESOURCE);
            }
            readInto(new InputStreamReader(s, StandardCharsets.UTF_8), "default-controller.yaml", values,
                    new LinkedHashMap<>(), problems, true);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        if (!problems.isEmpty() || !values.keySet().containsAll(RANGES.keySet())) {
            throw new IllegalStateException("broken default-controller.yaml: " + problems);
        }
        return values;
    }

    private static void readInto(Reader in, String name, Map<String, Double> values, Map<String, Integer> lines,
            List<String> problems, boolean checkKnown) {
        final Node root;
        try {
            root = new Yaml(new LoaderOptions()).compose(in);
        } catch (YAMLException e) {
            problems.add(name + ": not valid YAML: " + e.getMessage().replace('\n', ' '));
            return;
        }
        if (root == null) {
            return; // empty file: defaults only
        }
        if (!(root instanceof MappingNode)) {
            problems.add(name + ":" + line(root) + ": the file must be a mapping of sections");
            return;
        }
        for (NodeTuple section : ((MappingNode) root).getValue()) {
            final String sectionName = scalar(section.getKeyNode());
            final Node body = section.getValueNode();
            if (!(body instanceof MappingNode)) {
                problems.add(name + ":" + line(section.getKeyNode()) + ": " + sectionName
                        + ": must be a section of key: value lines");
                continue;
            }
            for (NodeTuple kv : ((MappingNode) body).getValue()) {
                final String key = sectionName + "." + scalar(kv.getKeyNode());
                final int line = line(kv.getKeyNode());
                if (checkKnown && !RANGES.containsKey(key)) {
                    problems.add(name + ":" + line + ": " + key + ": unknown key (known keys: see default-controller.yaml)");
                    continue;
                }
                final Node vn = kv.getValueNode();
                final String text = vn instanceof ScalarNode ? ((ScalarNode) vn).getValue() : null;
                final double value;
                try {
                    value = text == null ? Double.NaN : Double.parseDouble(text.trim());
                } catch (NumberFormatException e) {
                    problems.add(name + ":" + line + ": " + key + ": not a number: '" + text + "'");
                    continue;
                }
                if (!Double.isFinite(value)) {
                    problems.add(name + ":" + line + ": " + key + ": must be a finite number");
                    continue;
                }
                final double[] range = RANGES.get(key);
                if (range != null && (value < range[0] || value > range[1])) {
                    problems.add(name + ":" + line + ": " + key + ": " + value + " is outside "
                            + (range[0] == POS ? "(0" : "[" + range[0]) + ", " + range[1] + "]");
                    continue;
                }
                values.put(key, value);
                lines.put(key, line);
            }
        }
    }

    private static ControllerSettings build(Map<String, Double> v, Map<String, Integer> lines, String name) {
        final List<String> problems = new ArrayList<>();
        pair(v, lines, name, problems, "frt.exit_deviation_pu", "frt.enter_deviation_pu", "below", true);
        pair(v, lines, name, problems, "chopper.off_pu", "chopper.on_pu", "below", true);
        pair(v, lines, name, problems, "gsc.current_limit_pu", "gsc.current_limit_frt_pu", "at most", false);
        pair(v, lines, name, problems, "protection.undervoltage_fast_pu", "protection.undervoltage_pu", "below", true);
        pair(v, lines, name, problems, "protection.overvoltage_pu", "protection.overvoltage_fast_pu", "below", true);
        pair(v, lines, name, problems, "protection.undervoltage_fast_delay_s", "protection.undervoltage_delay_s",
                "at most", false);
        if (v.get("dc_voltage.reference_pu") * v.get("chopper.on_pu") <= v.get("dc_voltage.reference_pu")) {
            problems.add(where(name, lines, "chopper.on_pu") + ": must be above 1 (the DC reference)");
        }
        if (!problems.isEmpty()) {
            throw new IllegalArgumentException(String.join("\n", problems));
        }
        return new ControllerSettings(v);
    }

    private static void pair(Map<String, Double> v, Map<String, Integer> lines, String name, List<String> problems,
            String low, String high, String word, boolean strict) {
        final double a = v.get(low);
        final double b = v.get(high);
        if (strict ? a >= b : a > b) {
            if (lines.containsKey(low) || !lines.containsKey(high)) {
                problems.add(where(name, lines, low) + ": " + a + " must be " + word + " " + high + " (" + b + ")");
            } else {
                problems.add(where(name, lines, high) + ": " + b + " must be above " + low + " (" + a + ")");
            }
        }
    }

    private static String where(String name, Map<String, Integer> lines, String key) {
        final Integer line = lines.get(key);
        return name + (line == null ? "" : ":" + line) + ": " + key;
    }

    private static String scalar(Node n) {
        return n instanceof ScalarNode ? ((ScalarNode) n).getValue() : String.valueOf(n);
    }

    private static int line(Node n) {
        return n.getStartMark() == null ? 0 : n.getStartMark().getLine() + 1;
    }
}
