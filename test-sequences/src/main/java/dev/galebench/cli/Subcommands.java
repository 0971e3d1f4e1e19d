package dev.galebench.cli;

import java.util.List;

/** The one place where subcommands are registered; each line is one command of the tool. */
final class Subcommands {
    private Subcommands() {
    }

    static List<Object> all() {
        return List.of(
                new dev.galebench.runner.SequencesCommand()
        );
    }
}
