package dev.galebench.runner;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import dev.galebench.cli.GalebenchCommand;
import dev.galebench.sequence.Sequence;
import dev.galebench.sequence.SequenceLibrary;
import java.io.PrintWriter;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** {@code galebench sequences [--json]}: lists the shipped library, one line (or object) each. */
@Command(name = "sequences", mixinStandardHelpOptions = true,
        description = "Lists the shipped acceptance sequences (run one with: galebench run NAME).")
public final class SequencesCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Option(names = "--json", description = "Print a JSON array of objects (name, file, purpose, duration_s, checks, actions).")
    boolean json;

    @Override
    public Integer call() throws Exception {
        PrintWriter out = spec.commandLine().getOut();
        List<Map<String, Object>> rows = new ArrayList<>();
        int width = 0;
        for (String name : SequenceLibrary.names()) {
            width = Math.max(width, name.length());
        }
        for (String name : SequenceLibrary.names()) {
            Sequence s = SequenceLibrary.load(name);
            Map<String, Object> row = new LinkedHashMap<>();
            row.put("name", s.name());
            row.put("file", SequenceLibrary.fileOf(name));
            row.put("purpose", s.purpose());
            row.put("duration_s", s.durationS());
            row.put("actions", s.actions().size());
            row.put("checks", s.checks().size());
            rows.add(row);
            if (!json) {
                out.printf("%-" + width + "s  %6.1f s  %2d checks  %s%n", s.name(), s.durationS(), s.checks().size(),
                        firstSentence(s.purpose()));
            }
        }
        if (json) {
            out.println(new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT).writeValueAsString(rows));
        }
        out.flush();
        return GalebenchCommand.EXIT_OK;
    }

    static String firstSentence(String text) {
        String t = text.replaceAll("\\s+", " ").trim();
        int dot = t.indexOf(". ");
        return dot < 0 ? t : t.substring(0, dot + 1);
    }
}
