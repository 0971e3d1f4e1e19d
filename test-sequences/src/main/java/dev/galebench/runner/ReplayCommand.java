package dev.galebench.runner;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.galebench.cli.GalebenchCommand;
import dev.galebench.sequence.Sequence;
import dev.galebench.sequence.SequenceParser;
import java.io.PrintWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/**
 * {@code galebench replay RUN}: re-runs the plant offline from a run folder's recorded board
 * replies ({@code board-replies.bin}) and confirms that the waveforms are reproduced bit for bit
 * (same {@code waveform-digest.txt}). The replay's own report goes to {@code RUN/replay/}.
 * Exit 0 if reproduced exactly, 1 if not (the differing second and signals are named), 2 for a
 * folder that is not a run.
 */
@Command(name = "replay", mixinStandardHelpOptions = true,
        description = {"Re-runs the plant offline from a run folder's recorded board replies and checks that every "
                + "waveform is reproduced bit for bit.",
            "Exit codes: 0 reproduced exactly, 1 differences found, 2 not a run folder."})
public final class ReplayCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Parameters(index = "0", paramLabel = "RUN", description = "A run folder written by galebench run.")
    Path run;

    @Override
    public Integer call() throws Exception {
        PrintWriter out = spec.commandLine().getOut();
        Outcome o = replay(run, false);
        out.println(o.message());
        out.flush();
        return o.reproduced() ? GalebenchCommand.EXIT_OK : GalebenchCommand.EXIT_FAILED;
    }

    /** Result of a replay. */
    public record Outcome(boolean reproduced, String message, SequenceRunner.Result result) {
    }

    /**
     * Replays {@code runDir} into {@code runDir/replay}.
     *
     * @throws IllegalArgumentException if the folder lacks a file a replay needs
     */
    public static Outcome replay(Path runDir, boolean progress) throws Exception {
        for (String f : List.of("run.json", "sequence.yaml", ReplyLog.FILE_NAME, WaveformDigest.FILE_NAME)) {
            if (!Files.isRegularFile(runDir.resolve(f))) {
                throw new IllegalArgumentException(runDir + ": not a replayable run folder (no " + f + ")");
            }
        }
        JsonNode run = new ObjectMapper().readTree(runDir.resolve("run.json").toFile());
        String baseDir = run.path("base_dir").isNull() ? null : run.path("base_dir").asText(null);
        Sequence seq = SequenceParser.parse(run.path("sequence_source").asText(),
                Files.readString(runDir.resolve("sequence.yaml"), StandardCharsets.UTF_8),
                baseDir == null ? null : Path.of(baseDir));
        SequenceRunner.Options o = new SequenceRunner.Options();
        o.replayReplies = runDir.resolve(ReplyLog.FILE_NAME);
        o.stepUs = run.path("step_ns").asLong() / 1000.0;
        o.exchangeEvery = run.path("exchange_every").asInt();
        Path target = runDir.resolve("replay");
        if (Files.exists(target)) {
            try (var walk = Files.walk(target)) {
                walk.sorted(java.util.Comparator.reverseOrder()).forEach(p -> p.toFile().delete());
            }
        }
        o.folder = target;
        o.progress = progress;
        SequenceRunner.Result r = new SequenceRunner().run(seq, o);
        WaveformDigest.Parsed original = WaveformDigest.Parsed.of(
                Files.readString(runDir.resolve(WaveformDigest.FILE_NAME), StandardCharsets.UTF_8));
        WaveformDigest.Parsed again = WaveformDigest.Parsed.of(r.digest().text());
        List<String> diff = original.differences(again);
        if (original.samples() < 0) {
            return new Outcome(false, "replay of " + runDir + ": the original run lost " + (-original.samples())
                    + " samples, so its digest is incomplete; nothing to confirm", r);
        }
        if (diff.isEmpty()) {
            return new Outcome(true, "replay of " + runDir + ": reproduced bit for bit (" + again.samples()
                    + " samples of " + again.signals().size() + " signals); replay report: "
                    + target.resolve("report.html"), r);
        }
        return new Outcome(false, "replay of " + runDir + ": NOT reproduced: " + String.join("; ", diff)
                + "; replay report: " + target.resolve("report.html"), r);
    }
}
