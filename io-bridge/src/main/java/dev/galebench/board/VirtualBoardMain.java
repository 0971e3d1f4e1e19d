package dev.galebench.board;

import picocli.CommandLine;

/**
 * Runs the virtual board without the rest of the tool:
 * {@code java -cp ... dev.galebench.board.VirtualBoardMain --udp 127.0.0.1:0}. Same options
 * and exit codes as {@code galebench board}.
 */
public final class VirtualBoardMain {
    private VirtualBoardMain() {
    }

    public static void main(String[] args) {
        final CommandLine cl = new CommandLine(new BoardSubcommand());
        cl.setParameterExceptionHandler((ex, a) -> {
            ex.getCommandLine().getErr().println("galebench board: " + ex.getMessage());
            return 2;
        });
        System.exit(cl.execute(args));
    }
}
