package dev.galebench.board.control;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import dev.galebench.plant.TurbineFile;
import dev.galebench.plant.TurbineParameters;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.Map;
import java.util.concurrent.Callable;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

/**
 * {@code galebench controller ...}: the reference controller's settings and derived gains.
 * Exit codes: 0 ok, 2 bad input (unreadable or invalid turbine/controller file).
 */
@Command(name = "controller", mixinStandardHelpOptions = true,
        description = "Reference converter controller: derived gains and settings.",
        subcommands = {ControllerCommand.Show.class})
public final class ControllerCommand implements Runnable {
    @CommandLine.Spec
    CommandLine.Model.CommandSpec spec;

    @Override
    public void run() {
        spec.commandLine().usage(spec.commandLine().getOut());
    }

    /** {@code galebench controller show [--turbine FILE] [--controller FILE] [--json]}. */
    @Command(name = "show", mixinStandardHelpOptions = true,
            description = "Print the gains derived from the turbine file and the controller file.")
    static final class Show implements Callable<Integer> {
        @CommandLine.Spec
        CommandLine.Model.CommandSpec spec;

        @Option(names = "--turbine", paramLabel = "FILE", description = "turbine file (default: the shipped turbine)")
        Path turbineFile;

        @Option(names = "--controller", paramLabel = "FILE",
                description = "controller file; keys not set come from the shipped default-controller.yaml")
        Path controllerFile;

        @Option(names = "--json", description = "print JSON")
        boolean json;

        @Override
        public Integer call() throws JsonProcessingException {
            final ControllerTuning tuning;
            try {
                final TurbineParameters turbine = turbineFile == null ? TurbineFile.defaults() : TurbineFile.load(turbineFile);
                final ControllerSettings settings = ControllerFile.load(controllerFile);
                tuning = ControllerTuning.derive(turbine, settings);
            } catch (IllegalArgumentException | java.io.UncheckedIOException e) {
                final PrintWriter err = spec.commandLine().getErr();
                err.println("galebench controller show: " + e.getMessage());
                err.flush();
                return 2;
            }
            final PrintWriter out = spec.commandLine().getOut();
            if (json) {
                out.println(new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT).writeValueAsString(tuning.toMap()));
            } else {
                out.print(text(tuning.toMap(), ""));
            }
            out.flush();
            return 0;
        }

        @SuppressWarnings("unchecked")
        private static String text(Map<String, Object> m, String prefix) {
            final StringBuilder b = new StringBuilder();
            for (Map.Entry<String, Object> e : m.entrySet()) {
                if (e.getValue() instanceof Map) {
                    b.append(text((Map<String, Object>) e.getValue(), prefix + e.getKey() + "."));
                } else {
                    b.append(String.format("%-40s %s%n", prefix + e.getKey(), fmt(e.getValue())));
                }
            }
            return b.toString();
        }

        private static String fmt(Object v) {
            return v instanceof Double ? String.format("%.6g", (Double) v) : String.valueOf(v);
        }
    }
}
