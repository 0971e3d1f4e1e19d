package dev.galebench.cli;

import picocli.CommandLine;
import picocli.CommandLine.Command;

/**
 * The {@code galebench} command line. Exit codes everywhere: 0 = success and every check
 * passed, 1 = a check failed or a run was aborted, 2 = bad input or usage.
 */
@Command(name = "galebench",
        mixinStandardHelpOptions = true,
        versionProvider = GalebenchCommand.Version.class,
        description = "Real-time plant of a full-converter wind turbine for converter-firmware benches.",
        subcommands = {CommandLine.HelpCommand.class})
public final class GalebenchCommand implements Runnable {
    /** Success, every check passed. */
    public static final int EXIT_OK = 0;
    /** A check failed or a run was aborted. */
    public static final int EXIT_FAILED = 1;
    /** Bad input or usage. */
    public static final int EXIT_USAGE = 2;

    @CommandLine.Spec
    CommandLine.Model.CommandSpec spec;

    @Override
    public void run() {
        spec.commandLine().usage(System.out);
    }

    /** Builds the command line with every subcommand registered and the project's exit codes. */
    public static CommandLine commandLine() {
        CommandLine cl = new CommandLine(new GalebenchCommand());
        for (Object sub : Subcommands.all()) {
            cl.addSubcommand(sub);
        }
        cl.setExitCodeExceptionMapper(t -> EXIT_USAGE);
        cl.setParameterExceptionHandler((ex, args) -> {
            CommandLine c = ex.getCommandLine();
            c.getErr().println("galebench: " + ex.getMessage());
            c.getErr().println("Try '" + c.getCommandSpec().qualifiedName() + " --help'.");
            return EXIT_USAGE;
        });
        cl.setExecutionExceptionHandler((ex, c, parse) -> {
            if (ex instanceof IllegalArgumentException || ex instanceof java.io.UncheckedIOException
                    || ex instanceof java.io.IOException) {
                c.getErr().println("galebench: " + ex.getMessage());
                return EXIT_USAGE;
            }
            throw ex;
        });
        return cl;
    }

    public static void main(String[] args) {
        System.exit(commandLine().execute(args));
    }

    /** Version from the jar manifest, or "development" when run from classes. */
    static final class Version implements CommandLine.IVersionProvider {
        @Override
        public String[] getVersion() {
            String v = GalebenchCommand.class.getPackage().getImplementationVersion();
            return new String[] {"galebench " + (v == null ? "development" : v)};
        }
    }
}
