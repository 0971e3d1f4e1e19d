package dev.galebench.cli;

import java.util.ArrayList;
import java.util.List;

/** The one place where subcommands are registered; each line is one command of the tool. */
final class Subcommands {
    private Subcommands() {
    }

    static List<Object> all() {
        List<Object> commands = new ArrayList<>();
        commands.add(new dev.galebench.plant.cli.TurbineCommand());
        commands.add(new dev.galebench.board.BoardSubcommand());
        commands.add(new dev.galebench.runner.SequencesCommand());
        commands.add(new dev.galebench.runner.RunCommand());
        commands.add(new dev.galebench.runner.DemoCommand());
        commands.add(new dev.galebench.runner.CompareCommand());
        commands.add(new dev.galebench.runner.ReplayCommand());
        commands.add(new dev.galebench.cli.preflight.PreflightCommand());
        commands.add(new dev.galebench.board.control.ControllerCommand());
        commands.add(new dev.galebench.cli.serve.ServeCommand());
        return commands;
    }
}
