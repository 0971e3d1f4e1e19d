package dev.galebench.plant;

import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Collections;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.yaml.snakeyaml.LoaderOptions;
import org.yaml.snakeyaml.Yaml;
import org.yaml.snakeyaml.error.MarkedYAMLException;
import org.yaml.snakeyaml.error.YAMLException;
import org.yaml.snakeyaml.nodes.MappingNode;
import org.yaml.snakeyaml.nodes.Node;
import org.yaml.snakeyaml.nodes.NodeTuple;
import org.yaml.snakeyaml.nodes.ScalarNode;

/**
 * Loads a turbine file (YAML, or JSON, which the YAML parser reads as well) into validated
 * {@link TurbineParameters}. Keys carry their unit in the name ({@code rotor.radius_m}); they
 * are written either nested ({@code rotor:} then {@code radius_m: 58}) or flat with a dot
 * ({@code rotor.radius_m: 58}). Every key of {@link #keys()} is required; unknown keys are an
 * error (a misspelt key must not silently fall back to a default).
 *
 * <p>Loading collects every problem and throws one {@link IllegalArgumentException} whose
 * message has one line per problem, {@code file:line: key: reason} (without the line where
 * the file has none, e.g. a missing key). Checks, in order:
 * <ol>
 *   <li>syntax; each value a finite number; no unknown or duplicate key; no missing key;</li>
 *   <li>ranges per key (see {@link #keys()}: positive values, integers, 0/1 flags, pitch and
 *       filter limits);</li>
 *   <li>physical consistency: cut-in &lt; rated &lt; cut-out wind; minimum &lt; rated &lt;
 *       overspeed-trip rotor speed; tip speed at rated speed at most 120 m/s; Cp maximum of the
 *       surface within (0.05, 16/27] (Betz limit) with its optimum tip-speed ratio in [2, 20];
 *       the rotor reaching rated power at rated wind and speed; DC-link nominal voltage at least
 *       the line-to-line peak of the LV grid voltage (sqrt(2) V_LL: otherwise the grid-side
 *       diodes conduct and the modulation runs out); overvoltage trip above nominal; converter
 *       current trips above the rated peak current; the generator EMF at the overspeed trip
 *       below the DC overvoltage trip; generator rated voltage within 0.6..1.4 of the EMF at
 *       rated speed; transformer voltages LV &lt; MV &lt;= HV.</li>
 * </ol>
 */
public final class TurbineFile {
    /** One parameter key: dotted name, unit, and a short meaning. */
    public record Key(String name, String unit, String meaning, double min, double max, boolean integer) {
    }

    private static final double INF = Double.POSITIVE_INFINITY;
    private static final List<Key> KEYS = List.of(
            k("rotor.air_density_kg_m3", "kg/m3", "air density", 0.5, 2.0),
            k("rotor.radius_m", "m", "rotor radius (swept area pi R^2)", 1.0, 200.0),
            k("rotor.cp_c1", "1", "Cp surface c1", 1e-6, 10.0),
            k("rotor.cp_c2", "1", "Cp surface c2", 1e-6, 1000.0),
            k("rotor.cp_c3", "1", "Cp surface c3 (per degree)", 0.0, 10.0),
            k("rotor.cp_c4", "1", "Cp surface c4", 0.0, 10.0),
            k("rotor.cp_c5", "1", "Cp surface c5", 0.0, 100.0),
            k("rotor.cp_c6", "1", "Cp surface c6", 1e-6, 100.0),
            k("rotor.cp_c7", "1", "Cp surface c7", -1.0, 1.0),
            k("rotor.cp_c8", "1", "Cp surface c8 (per degree)", -1.0, 1.0),
            k("rotor.cp_c9", "1", "Cp surface c9", -1.0, 1.0),
            k("rotor.cp_x", "1", "Cp surface exponent x of the c4 term", 0.0, 10.0),
            k("rotor.cut_in_wind_m_s", "m/s", "cut-in wind speed", 0.5, 10.0),
            k("rotor.rated_wind_m_s", "m/s", "rated wind speed", 3.0, 30.0),
            k("rotor.cut_out_wind_m_s", "m/s", "cut-out wind speed", 5.0, 50.0),
            k("rotor.rated_speed_rad_s", "rad/s", "rated rotor speed", 0.05, 100.0),
            k("rotor.min_speed_rad_s", "rad/s", "minimum rotor speed in operation", 0.0, 100.0),
            k("rotor.overspeed_trip_rad_s", "rad/s", "rotor overspeed trip", 0.05, 200.0),
            k("pitch.min_rad", "rad", "pitch lower limit", -0.2, 0.5),
            k("pitch.max_rad", "rad", "pitch upper limit (feather)", 0.1, 1.7),
            k("pitch.rate_max_rad_s", "rad/s", "pitch rate limit", 1e-3, 1.0),
            k("pitch.servo_time_constant_s", "s", "pitch servo time constant", 1e-3, 5.0),
            k("drivetrain.rotor_inertia_kg_m2", "kg m2", "rotor (hub + blades) inertia", 1e-3, 1e10),
            k("drivetrain.generator_inertia_kg_m2", "kg m2", "generator rotor inertia (own shaft)", 1e-6, 1e10),
            new Key("drivetrain.two_mass", "-", "0 = one mass, 1 = two masses with a shaft", 0, 1, true),
            k("drivetrain.shaft_stiffness_nm_rad", "N m/rad", "shaft torsional stiffness (low-speed side)", 0.0, 1e13),
            k("drivetrain.shaft_damping_nms_rad", "N m s/rad", "shaft torsional damping (low-speed side)", 0.0, 1e12),
            k("drivetrain.friction_nms_rad", "N m s/rad", "viscous friction on the rotor speed", 0.0, 1e10),
            k("drivetrain.gear_ratio", "1", "generator speed / rotor speed (1 = direct drive)", 1.0, 500.0),
            k("generator.rated_power_w", "W", "rated power (aerodynamic power held above rated wind; per-unit base)", 1e3, 5e7),
            new Key("generator.pole_pairs", "1", "pole pairs", 1, 1000, true),
            k("generator.stator_resistance_ohm", "ohm", "stator resistance per phase", 1e-7, 100.0),
            k("generator.ld_h", "H", "d-axis inductance", 1e-7, 10.0),
            k("generator.lq_h", "H", "q-axis inductance", 1e-7, 10.0),
            k("generator.magnet_flux_wb", "Wb", "magnet flux linkage (peak, amplitude-invariant dq)", 1e-4, 1000.0),
            k("generator.rated_voltage_v", "V", "generator rated voltage (line-to-line rms)", 10.0, 40000.0),
            k("dc_link.capacitance_f", "F", "DC-link capacitance", 1e-6, 10.0),
            k("dc_link.nominal_voltage_v", "V", "DC-link nominal voltage", 10.0, 20000.0),
            k("dc_link.chopper_resistance_ohm", "ohm", "braking-chopper resistance", 1e-3, 1e4),
            k("dc_link.overvoltage_trip_v", "V", "DC-link overvoltage hardware trip", 10.0, 30000.0),
            k("converter.msc_current_trip_a", "A", "machine-side overcurrent trip (peak phase)", 1.0, 1e6),
            k("converter.gsc_current_trip_a", "A", "grid-side overcurrent trip (peak phase)", 1.0, 1e6),
            k("converter.rated_current_a", "A", "converter rated current (rms, grid side)", 1.0, 1e6),
            k("converter.switching_frequency_hz", "Hz", "PWM switching frequency", 100.0, 1e5),
            k("grid_filter.inductance_h", "H", "grid choke inductance per phase", 1e-8, 1.0),
            k("grid_filter.resistance_ohm", "ohm", "grid choke resistance per phase", 0.0, 100.0),
            k("converter_transformer.lv_voltage_v", "V", "converter transformer LV (line-to-line rms)", 10.0, 40000.0),
            k("converter_transformer.mv_voltage_v", "V", "converter transformer MV (line-to-line rms)", 10.0, 400000.0),
            k("converter_transformer.rating_va", "VA", "converter transformer rating", 1e3, 1e9),
            k("converter_transformer.short_circuit_pu", "pu", "converter transformer u_k on its rating", 1e-3, 0.5),
            k("converter_transformer.x_over_r", "1", "converter transformer X/R", 0.1, 200.0),
            k("plant_transformer.hv_voltage_v", "V", "plant transformer HV = point of connection (line-to-line rms)", 10.0, 800000.0),
            k("plant_transformer.rating_va", "VA", "plant transformer rating", 1e3, 1e10),
            k("plant_transformer.short_circuit_pu", "pu", "plant transformer u_k on its rating", 1e-3, 0.5),
            k("plant_transformer.x_over_r", "1", "plant transformer X/R", 0.1, 200.0),
            k("grid.frequency_hz", "Hz", "nominal grid frequency", 40.0, 70.0),
            k("grid.short_circuit_ratio", "1", "SCR = S_sc / rated power at the point of connection", 0.5, 1000.0),
            k("grid.x_over_r", "1", "grid Thevenin X/R", 0.1, 200.0),
            k("measurement.current_filter_s", "s", "anti-alias filter time constant, currents", 0.0, 0.01),
            k("measurement.voltage_filter_s", "s", "anti-alias filter time constant, voltages", 0.0, 0.01));

    private static final Map<String, Key> BY_NAME;

    static {
        Map<String, Key> m = new HashMap<>();
        for (Key key : KEYS) {
            m.put(key.name(), key);
        }
        BY_NAME = Collections.unmodifiableMap(m);
    }

    private static volatile TurbineParameters defaults;

    private TurbineFile() {
    }

    private static Key k(String name, String unit, String meaning, double min, double max) {
        return new Key(name, unit, meaning, min, max, false);
    }

    /** Every parameter key in file order, with unit, meaning and allowed range. */
    public static List<Key> keys() {
        return KEYS;
    }

    /** Loads and validates a turbine file. */
    public static TurbineParameters load(Path file) {
        String text;
        try {
            text = Files.readString(file, StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new IllegalArgumentException(file + ": cannot read turbine file: " + e.getMessage(), e);
        }
        return parse(text, file.toString());
    }

    /** The shipped default turbine ({@code default-turbine.yaml} on the class path), loaded once. */
    public static TurbineParameters defaults() {
        TurbineParameters d = defaults;
        if (d == null) {
            try (InputStream in = TurbineFile.class.getResourceAsStream("default-turbine.yaml")) {
                if (in == null) {
                    throw new IllegalStateException("default-turbine.yaml missing from the class path");
                }
                d = parse(new String(in.readAllBytes(), StandardCharsets.UTF_8), "default-turbine.yaml");
            } catch (IOException e) {
                throw new UncheckedIOException(e);
            }
            defaults = d;
        }
        return d;
    }

    /** Parses and validates turbine-file text; {@code sourceName} prefixes every message. */
    public static TurbineParameters parse(String text, String sourceName) {
        List<String> problems = new ArrayList<>();
        Map<String, Double> values = new LinkedHashMap<>();
        Map<String, Integer> lines = new HashMap<>();
        Node root;
        try {
            LoaderOptions options = new LoaderOptions();
            options.setAllowDuplicateKeys(true); // we report duplicates ourselves, with lines
            root = new Yaml(options).compose(new java.io.StringReader(text));
        } catch (MarkedYAMLException e) {
            int line = e.getProblemMark() != null ? e.getProblemMark().getLine() + 1 : 0;
            throw new IllegalArgumentException(sourceName + ":" + line + ": (syntax): " + e.getProblem());
        } catch (YAMLException e) {
            throw new IllegalArgumentException(sourceName + ": (syntax): " + e.getMessage());
        }
        if (!(root instanceof MappingNode)) {
            throw new IllegalArgumentException(sourceName + ":1: (document): expected a mapping of sections to parameters");
        }
        collect((MappingNode) root, "", sourceName, values, lines, problems);
        for (Key key : KEYS) {
            if (!values.containsKey(key.name()) && !lines.containsKey(key.name())) {
                problems.add(sourceName + ": " + key.name() + ": missing (" + key.meaning() + ", unit " + key.unit() + ")");
            }
        }
        checkRanges(values, lines, sourceName, problems, false);
        if (problems.isEmpty()) {
            Map<String, Double> ordered = new LinkedHashMap<>();
            for (Key key : KEYS) {
                ordered.put(key.name(), values.get(key.name()));
            }
            checkConsistency(new TurbineParameters(ordered), lines, sourceName, problems);
            if (problems.isEmpty()) {
                return new TurbineParameters(ordered);
            }
        }
        throw new IllegalArgumentException(String.join("\n", problems));
    }

    /**
     * Validates parameters built in code (e.g. with {@link TurbineParameters#with}); same checks
     * as loading, messages prefixed by {@code sourceName}, without line numbers.
     */
    public static void validate(TurbineParameters p, String sourceName) {
        List<String> problems = new ArrayList<>();
        Map<String, Integer> noLines = Map.of();
        checkRanges(p.values(), noLines, sourceName, problems, true);
        if (problems.isEmpty()) {
            checkConsistency(p, noLines, sourceName, problems);
        }
        if (!problems.isEmpty()) {
            throw new IllegalArgumentException(String.join("\n", problems));
        }
    }

    private static void collect(MappingNode map, String prefix, String src, Map<String, Double> values,
                                Map<String, Integer> lines, List<String> problems) {
        for (NodeTuple t : map.getValue()) {
            int line = t.getKeyNode().getStartMark().getLine() + 1;
            if (!(t.getKeyNode() instanceof ScalarNode)) {
                problems.add(src + ":" + line + ": (key): a key must be a plain name");
                continue;
            }
            String name = prefix + ((ScalarNode) t.getKeyNode()).getValue();
            Node v = t.getValueNode();
            if (v instanceof MappingNode) {
                collect((MappingNode) v, name + ".", src, values, lines, problems);
                continue;
            }
            if (!BY_NAME.containsKey(name)) {
                problems.add(src + ":" + line + ": " + name + ": unknown parameter" + hint(name));
                continue;
            }
            if (lines.containsKey(name)) {
                problems.add(src + ":" + line + ": " + name + ": duplicate (first given on line " + lines.get(name) + ")");
                continue;
            }
            lines.put(name, line);
            if (!(v instanceof ScalarNode)) {
                problems.add(src + ":" + line + ": " + name + ": expected a number, found a list");
                continue;
            }
            String raw = ((ScalarNode) v).getValue().trim();
            double d;
            try {
                d = Double.parseDouble(raw.replace("_", ""));
            } catch (NumberFormatException e) {
                problems.add(src + ":" + line + ": " + name + ": expected a number, found '" + raw + "'");
                continue;
            }
            if (!Double.isFinite(d)) {
                problems.add(src + ":" + line + ": " + name + ": must be finite, found '" + raw + "'");
                continue;
            }
            values.put(name, d);
        }
    }

    private static String hint(String name) {
        int dot = name.lastIndexOf('.');
        String tail = dot >= 0 ? name.substring(dot + 1) : name;
        for (Key k : KEYS) {
            if (k.name().endsWith("." + tail) || k.name().startsWith(name)) {
                return " (did you mean " + k.name() + "?)";
            }
        }
        return "";
    }

    private static String where(String src, Map<String, Integer> lines, String key) {
        Integer line = lines.get(key);
        return line == null ? src + ": " + key + ": " : src + ":" + line + ": " + key + ": ";
    }

    private static void checkRanges(Map<String, Double> values, Map<String, Integer> lines, String src,
                                    List<String> problems, boolean reportMissing) {
        for (Key key : KEYS) {
            Double boxed = values.get(key.name());
            if (boxed == null) {
                if (reportMissing) {
                    problems.add(src + ": " + key.name() + ": missing");
                }
                continue;
            }
            double v = boxed;
            if (!Double.isFinite(v) || v < key.min() || v > key.max()) {
                problems.add(where(src, lines, key.name()) + "out of range: " + fmt(v) + " " + key.unit()
                        + " not in [" + fmt(key.min()) + ", " + fmt(key.max()) + "]");
            } else if (key.integer() && v != Math.rint(v)) {
                problems.add(where(src, lines, key.name()) + "must be a whole number, found " + fmt(v));
            }
        }
    }

    private static void checkConsistency(TurbineParameters p, Map<String, Integer> lines, String src,
                                         List<String> problems) {
        if (!(p.cutInWindMPerS < p.ratedWindMPerS)) {
            problems.add(where(src, lines, "rotor.rated_wind_m_s") + "must be above rotor.cut_in_wind_m_s (" + fmt(p.cutInWindMPerS) + ")");
        }
        if (!(p.ratedWindMPerS < p.cutOutWindMPerS)) {
            problems.add(where(src, lines, "rotor.cut_out_wind_m_s") + "must be above rotor.rated_wind_m_s (" + fmt(p.ratedWindMPerS) + ")");
        }
        if (!(p.minRotorSpeedRadPerS < p.ratedRotorSpeedRadPerS)) {
            problems.add(where(src, lines, "rotor.min_speed_rad_s") + "must be below rotor.rated_speed_rad_s (" + fmt(p.ratedRotorSpeedRadPerS) + ")");
        }
        if (!(p.overspeedTripRadPerS > p.ratedRotorSpeedRadPerS)) {
            problems.add(where(src, lines, "rotor.overspeed_trip_rad_s") + "must be above rotor.rated_speed_rad_s (" + fmt(p.ratedRotorSpeedRadPerS) + ")");
        }
        double tip = p.ratedRotorSpeedRadPerS * p.rotorRadiusM;
        if (tip > 120.0) {
            problems.add(where(src, lines, "rotor.rated_speed_rad_s") + "tip speed at rated speed " + fmt(tip) + " m/s exceeds 120 m/s");
        }
        if (!(p.pitchMinRad < p.pitchMaxRad)) {
            problems.add(where(src, lines, "pitch.max_rad") + "must be above pitch.min_rad (" + fmt(p.pitchMinRad) + ")");
        }
        if (p.twoMass && !(p.shaftStiffnessNmPerRad > 0.0)) {
            problems.add(where(src, lines, "drivetrain.shaft_stiffness_nm_rad") + "must be positive when drivetrain.two_mass is 1");
        }
        CpSurface cps = CpSurface.of(p);
        double cpMax = cps.maxCp();
        double lopt = cps.optimalTipSpeedRatio();
        if (!(cpMax > 0.05 && cpMax <= 16.0 / 27.0 + 1e-12) || !(lopt >= 2.0 && lopt <= 20.0)) {
            problems.add(where(src, lines, "rotor.cp_c1") + "Cp surface maximum " + fmt(cpMax) + " at lambda "
                    + fmt(lopt) + " is not physical (need 0.05 < Cp_max <= 16/27 (Betz), 2 <= lambda_opt <= 20)");
        } else {
            double area = Math.PI * p.rotorRadiusM * p.rotorRadiusM;
            double pMax = 0.5 * p.airDensityKgPerM3 * area * cpMax * Math.pow(p.ratedWindMPerS, 3);
            if (pMax < p.ratedPowerW * (1.0 - 1e-9)) {
                problems.add(where(src, lines, "rotor.rated_wind_m_s") + "the rotor cannot reach generator.rated_power_w at rated wind: "
                        + fmt(pMax) + " W at Cp_max < " + fmt(p.ratedPowerW) + " W");
            }
        }
        double lvPeakLineV = Math.sqrt(2.0) * p.lvVoltageV;
        if (p.dcVoltageNominalV < lvPeakLineV) {
            problems.add(where(src, lines, "dc_link.nominal_voltage_v") + "below the line-to-line peak of the LV grid voltage ("
                    + fmt(lvPeakLineV) + " V): the grid-side diodes would conduct");
        }
        if (!(p.dcOvervoltageTripV > p.dcVoltageNominalV)) {
            problems.add(where(src, lines, "dc_link.overvoltage_trip_v") + "must be above dc_link.nominal_voltage_v (" + fmt(p.dcVoltageNominalV) + ")");
        }
        double ratedPeak = Math.sqrt(2.0) * p.converterRatedCurrentA;
        if (!(p.gscCurrentTripA > ratedPeak)) {
            problems.add(where(src, lines, "converter.gsc_current_trip_a") + "must be above the rated peak current " + fmt(ratedPeak) + " A");
        }
        if (!(p.mscCurrentTripA > ratedPeak)) {
            problems.add(where(src, lines, "converter.msc_current_trip_a") + "must be above the rated peak current " + fmt(ratedPeak) + " A");
        }
        double emfTripLinePeak = Math.sqrt(3.0) * p.magnetFluxWb * p.polePairs * p.gearRatio * p.overspeedTripRadPerS;
        if (emfTripLinePeak >= p.dcOvervoltageTripV) {
            problems.add(where(src, lines, "generator.magnet_flux_wb") + "generator EMF at the overspeed trip (" + fmt(emfTripLinePeak)
                    + " V line-to-line peak) reaches the DC overvoltage trip: the machine-side diodes would rectify uncontrolled");
        }
        double emfRatedLineRms = Math.sqrt(1.5) * p.magnetFluxWb * p.polePairs * p.gearRatio * p.ratedRotorSpeedRadPerS;
        double ratio = p.ratedStatorVoltageV / emfRatedLineRms;
        if (ratio < 0.6 || ratio > 1.4) {
            problems.add(where(src, lines, "generator.rated_voltage_v") + "is " + fmt(ratio) + " times the EMF at rated speed ("
                    + fmt(emfRatedLineRms) + " V line-to-line rms); expected 0.6..1.4");
        }
        if (!(p.lvVoltageV < p.mvVoltageV)) {
            problems.add(where(src, lines, "converter_transformer.mv_voltage_v") + "must be above converter_transformer.lv_voltage_v");
        }
        if (!(p.mvVoltageV <= p.hvVoltageV)) {
            problems.add(where(src, lines, "plant_transformer.hv_voltage_v") + "must be at least converter_transformer.mv_voltage_v");
        }
    }

    private static String fmt(double v) {
        if (v == Math.rint(v) && Math.abs(v) < 1e15) {
            return Long.toString((long) v);
        }
        return String.format(java.util.Locale.ROOT, "%.6g", v);
    }
}
