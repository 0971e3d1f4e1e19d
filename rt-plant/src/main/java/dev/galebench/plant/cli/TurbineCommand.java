package dev.galebench.plant.cli;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import dev.galebench.plant.CpSurface;
import dev.galebench.plant.OperatingPoint;
import dev.galebench.plant.PerUnitBase;
import dev.galebench.plant.SteadyState;
import dev.galebench.plant.TurbineFile;
import dev.galebench.plant.TurbineParameters;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.Callable;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

/**
 * {@code galebench turbine}: inspect a turbine file and its settled operating points.
 * Exit codes: 0 ok, 2 bad input (unreadable or invalid turbine file, out-of-range option),
 * with one message line per problem on standard error.
 */
@Command(name = "turbine", mixinStandardHelpOptions = true,
        description = "Show a turbine's parameters or a settled operating point.",
        subcommands = {TurbineCommand.Show.class, TurbineCommand.Steady.class})
public final class TurbineCommand implements Runnable {
    static final int EXIT_OK = 0;
    static final int EXIT_USAGE = 2;

    @CommandLine.Spec
    CommandLine.Model.CommandSpec spec;

    @Override
    public void run() {
        spec.commandLine().usage(spec.commandLine().getOut());
    }

    static TurbineParameters load(Path file) {
        return file == null ? TurbineFile.defaults() : TurbineFile.load(file);
    }

    static String json(Object value) {
        try {
            return new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT).writeValueAsString(value);
        } catch (com.fasterxml.jackson.core.JsonProcessingException e) {
            throw new IllegalStateException(e);
        }
    }

    static int fail(CommandLine.Model.CommandSpec spec, IllegalArgumentException e) {
        PrintWriter err = spec.commandLine().getErr();
        for (String line : e.getMessage().split("\n")) {
            err.println("galebench: " + line);
        }
        err.flush();
        return EXIT_USAGE;
    }

    /** Derived quantities worth seeing next to the file's numbers. */
    static Map<String, Object> derived(TurbineParameters p) {
        Map<String, Object> d = new LinkedHashMap<>();
        CpSurface cps = CpSurface.of(p);
        PerUnitBase grid = PerUnitBase.gridSide(p);
        PerUnitBase gen = PerUnitBase.generatorSide(p);
        double area = Math.PI * p.rotorRadiusM * p.rotorRadiusM;
        d.put("swept_area_m2", area);
        d.put("specific_rating_w_m2", p.ratedPowerW / area);
        d.put("tip_speed_rated_m_s", p.ratedRotorSpeedRadPerS * p.rotorRadiusM);
        d.put("cp_max", cps.maxCp());
        d.put("tip_speed_ratio_opt", cps.optimalTipSpeedRatio());
        d.put("k_opt_nm_per_rad_s2", 0.5 * p.airDensityKgPerM3 * Math.PI * Math.pow(p.rotorRadiusM, 5) * cps.maxCp()
                / Math.pow(cps.optimalTipSpeedRatio(), 3));
        d.put("inertia_constant_s", PerUnitBase.gridSide(p).inertiaConstantS(p.rotorInertiaKgM2
                + p.generatorInertiaKgM2 * p.gearRatio * p.gearRatio));
        d.put("electrical_frequency_rated_hz", p.polePairs * p.gearRatio * p.ratedRotorSpeedRadPerS / (2.0 * Math.PI));
        d.put("emf_rated_line_rms_v", Math.sqrt(1.5) * p.magnetFluxWb * p.polePairs * p.gearRatio * p.ratedRotorSpeedRadPerS);
        d.put("stator_resistance_pu", gen.impedanceToPu(p.statorResistanceOhm));
        d.put("ld_pu", gen.inductanceToPu(p.dAxisInductanceH));
        d.put("lq_pu", gen.inductanceToPu(p.qAxisInductanceH));
        d.put("dc_energy_time_constant_s", p.dcCapacitanceF * p.dcVoltageNominalV * p.dcVoltageNominalV / (2.0 * p.ratedPowerW));
        d.put("choke_inductance_pu", grid.inductanceToPu(p.chokeInductanceH));
        d.put("choke_resistance_pu", grid.impedanceToPu(p.chokeResistanceOhm));
        d.put("grid_impedance_pu", 1.0 / p.shortCircuitRatio);
        d.put("base_impedance_lv_ohm", grid.impedanceOhm);
        d.put("base_current_lv_peak_a", grid.currentPeakA);
        return d;
    }

    @Command(name = "show", mixinStandardHelpOptions = true,
            description = "Print every parameter of a turbine with its unit (and derived quantities).")
    static final class Show implements Callable<Integer> {
        @CommandLine.Spec
        CommandLine.Model.CommandSpec spec;

        @Option(names = "--turbine", paramLabel = "FILE", description = "turbine file (YAML or JSON); default: the shipped turbine")
        Path turbine;

        @Option(names = "--json", description = "print JSON")
        boolean json;

        @Override
        public Integer call() {
            TurbineParameters p;
            try {
                p = load(turbine);
            } catch (IllegalArgumentException e) {
                return fail(spec, e);
            }
            PrintWriter out = spec.commandLine().getOut();
            Map<String, Object> derived = derived(p);
            if (json) {
                Map<String, Object> root = new LinkedHashMap<>();
                root.put("source", turbine == null ? "default-turbine.yaml" : turbine.toString());
                Map<String, Object> params = new LinkedHashMap<>();
                for (TurbineFile.Key k : TurbineFile.keys()) {
                    Map<String, Object> e = new LinkedHashMap<>();
                    e.put("value", p.values().get(k.name()));
                    e.put("unit", k.unit());
                    e.put("meaning", k.meaning());
                    params.put(k.name(), e);
                }
                root.put("parameters", params);
                root.put("derived", derived);
                out.println(json(root));
            } else {
                out.println("turbine: " + (turbine == null ? "default-turbine.yaml (shipped)" : turbine));
                out.printf(Locale.ROOT, "%-40s %14s  %-10s %s%n", "parameter", "value", "unit", "meaning");
                for (TurbineFile.Key k : TurbineFile.keys()) {
                    out.printf(Locale.ROOT, "%-40s %14.6g  %-10s %s%n", k.name(), p.values().get(k.name()), k.unit(), k.meaning());
                }
                out.println();
                out.println("derived:");
                for (Map.Entry<String, Object> e : derived.entrySet()) {
                    out.printf(Locale.ROOT, "  %-38s %14.6g%n", e.getKey(), (Double) e.getValue());
                }
            }
            out.flush();
            return EXIT_OK;
        }
    }

    @Command(name = "steady", mixinStandardHelpOptions = true,
            description = "Print the settled operating point at a wind speed (MPPT below rated, pitch above).")
    static final class Steady implements Callable<Integer> {
        @CommandLine.Spec
        CommandLine.Model.CommandSpec spec;

        @Option(names = "--wind", required = true, paramLabel = "V", description = "hub wind speed, m/s (0..60)")
        double wind;

        @Option(names = "--grid-voltage", paramLabel = "PU", defaultValue = "1.0",
                description = "grid source voltage, pu (0.05..2; default ${DEFAULT-VALUE})")
        double gridVoltagePu;

        @Option(names = "--q-pu", paramLabel = "Q", defaultValue = "0.0",
                description = "reactive power at the terminal, pu of rated power, positive = capacitive (-2..2; default ${DEFAULT-VALUE})")
        double reactivePowerPu;

        @Option(names = "--terminal-voltage", paramLabel = "PU",
                description = "instead of --q-pu: find the reactive power that holds this terminal voltage, pu (0.1..2)")
        Double terminalVoltagePu;

        @Option(names = "--turbine", paramLabel = "FILE", description = "turbine file (YAML or JSON); default: the shipped turbine")
        Path turbine;

        @Option(names = "--json", description = "print JSON")
        boolean json;

        @Override
        public Integer call() {
            OperatingPoint op;
            try {
                op = terminalVoltagePu == null
                        ? SteadyState.solve(load(turbine), wind, gridVoltagePu, reactivePowerPu)
                        : SteadyState.solveAtTerminalVoltage(load(turbine), wind, gridVoltagePu, terminalVoltagePu);
            } catch (IllegalArgumentException e) {
                return fail(spec, e);
            }
            PrintWriter out = spec.commandLine().getOut();
            if (json) {
                out.println(op.toJson());
            } else {
                out.printf(Locale.ROOT, "settled operating point (%s), wind %.2f m/s, grid %.3f pu, Q %.3f pu%n",
                        op.region, op.windMPerS, op.gridVoltagePu, op.reactivePowerPu);
                for (Map.Entry<String, Object> e : op.toMap().entrySet()) {
                    if (e.getValue() instanceof Double) {
                        out.printf(Locale.ROOT, "  %-26s %16.6g%n", e.getKey(), (Double) e.getValue());
                    }
                }
            }
            out.flush();
            return EXIT_OK;
        }
    }
}
