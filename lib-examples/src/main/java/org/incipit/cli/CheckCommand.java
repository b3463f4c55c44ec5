package org.incipit.cli;

import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.incipit.core.observe.AmbiguousStartCases;
import org.incipit.core.observe.DailyCounts;
import org.incipit.core.observe.DelayPairs;
import org.incipit.core.observe.ExposureWindows;
import org.incipit.io.CsvInput;
import org.incipit.io.JsonOutput;
import org.incipit.io.ReadResult;
import org.incipit.io.SkippedRow;
import org.incipit.io.TextTable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/**
 * {@code incipit check KIND FILE}: reads an input file as the estimators would and describes
 * what was read, so that a file can be checked before any estimate is made. Needs no
 * estimator.
 */
@Command(name = "check",
        mixinStandardHelpOptions = true,
        description = {"Read an input file and describe what was read (no estimation).", ""},
        footer = {"",
            "File kinds (CSV with a header line; '#' starts a comment line):",
            "  intervals   case,end,start[,kind][,exposures_total]",
            "              one row per candidate start",
            "  delays      case,primary,secondary[,daily]",
            "              empty secondary = not yet observed at the cut-off",
            "  incubation  case,exposure_from,exposure_to,onset",
            "  counts      day,cases[,deaths][,recoveries][,imported]",
            "              one row per day, consecutive days",
            "Times are day numbers or dates (yyyy-MM-dd), one kind per file;",
            "dates become day numbers counted from --origin",
            "(default: the earliest date in the file)."})
public final class CheckCommand extends AbstractCommand {

    /** The input file kinds. */
    public enum Kind {
        /** Cases with candidate starts. */
        intervals,
        /** Primary and secondary times. */
        delays,
        /** Exposure windows and onsets. */
        incubation,
        /** Daily counts. */
        counts
    }

    @Parameters(index = "0", paramLabel = "KIND", description = "File kind: ${COMPLETION-CANDIDATES}.")
    Kind kind;

    @Parameters(index = "1", paramLabel = "FILE", description = "The CSV file.")
    Path file;

    @Option(names = "--cutoff", paramLabel = "TIME",
            description = "Delays: the cut-off (day number or date, like the file); "
                    + "pairs with an empty secondary are right-censored at it.")
    String cutoff;

    @Mixin
    InputOptions input;

    /** Creates the command. */
    public CheckCommand() {
    }

    @Override
    protected int run() {
        if (cutoff != null && kind != Kind.delays) {
            throw new IllegalArgumentException("--cutoff applies only to delays files");
        }
        ObjectNode json = JsonOutput.object();
        json.put("command", "check");
        json.put("kind", kind.name());
        List<String[]> lines = new ArrayList<>();
        ReadResult<?> read;
        switch (kind) {
            case intervals -> {
                ReadResult<AmbiguousStartCases> r = CsvInput.intervals(file, input.readOptions());
                AmbiguousStartCases c = r.data();
                int several = 0;
                for (int i = 0; i < c.caseCount(); i++) {
                    several += c.candidateCount(i) > 1 ? 1 : 0;
                }
                int withTotal = 0;
                for (int i = 0; i < c.caseCount(); i++) {
                    withTotal += c.totalExposures(i) != AmbiguousStartCases.UNKNOWN_TOTAL ? 1 : 0;
                }
                put(json, lines, "cases", c.caseCount());
                put(json, lines, "candidates", c.candidateCount());
                put(json, lines, "casesWithSeveralCandidates", several);
                put(json, lines, "casesWithTotalExposures", withTotal);
                ArrayNode cats = json.putArray("categories");
                c.categoryNames().forEach(cats::add);
                lines.add(new String[] {"categories", c.hasCategories() ? String.join(", ", c.categoryNames()) : "none"});
                range(json, lines, r, "end", c.ends());
                read = r;
            }
            case delays -> {
                ReadResult<DelayPairs> r = CsvInput.delays(file, input.readOptions(), cutoff);
                DelayPairs p = r.data();
                put(json, lines, "pairs", p.size());
                put(json, lines, "observed", p.observedCount());
                put(json, lines, "censored", p.censoredCount());
                int daily = 0;
                for (boolean b : p.dailyFlags()) {
                    daily += b ? 1 : 0;
                }
                put(json, lines, "dailyPairs", daily);
                if (p.cutoff().isPresent()) {
                    json.put("cutoff", p.cutoff().getAsDouble());
                    lines.add(new String[] {"cutoff", day(r, p.cutoff().getAsDouble())});
                }
                range(json, lines, r, "primary", p.primaries());
                read = r;
            }
            case incubation -> {
                ReadResult<ExposureWindows> r = CsvInput.incubation(file, input.readOptions());
                ExposureWindows w = r.data();
                put(json, lines, "cases", w.size());
                int single = 0;
                for (int i = 0; i < w.size(); i++) {
                    single += w.exposureFrom(i) == w.exposureTo(i) ? 1 : 0;
                }
                put(json, lines, "singleExposureTime", single);
                range(json, lines, r, "onset", w.onsets());
                read = r;
            }
            case counts -> {
                ReadResult<DailyCounts> r = CsvInput.dailyCounts(file, input.readOptions());
                DailyCounts d = r.data();
                put(json, lines, "days", d.size());
                json.put("totalCases", d.totalCases());
                lines.add(new String[] {"totalCases", Long.toString(d.totalCases())});
                if (d.hasDeaths()) {
                    put(json, lines, "totalDeaths", sum(d.deaths()));
                }
                if (d.hasRecoveries()) {
                    put(json, lines, "totalRecoveries", sum(d.recoveries()));
                }
                if (d.hasImported()) {
                    put(json, lines, "totalImported", sum(d.imported()));
                }
                double[] days = new double[d.size()];
                for (int i = 0; i < days.length; i++) {
                    days[i] = d.day(i);
                }
                range(json, lines, r, "day", days);
                read = r;
            }
            default -> throw new IllegalStateException("unknown kind " + kind);
        }
        json.put("file", read.file());
        json.put("dataRows", read.dataRows());
        json.put("times", read.dates() ? "dates" : "day numbers");
        if (read.origin() != null) {
            json.put("origin", read.origin().toString());
        } else {
            json.putNull("origin");
        }
        ArrayNode skipped = json.putArray("skipped");
        for (SkippedRow s : read.skipped()) {
            ObjectNode o = skipped.addObject();
            o.put("line", s.line());
            o.put("reason", s.reason());
        }
        reportSkipped(read);
        TextTable table = TextTable.of("item", "value")
                .row("file", read.file())
                .row("kind", kind.name())
                .row("dataRows", read.dataRows() + (read.skipped().isEmpty() ? ""
                        : " (" + read.skipped().size() + " skipped)"))
                .row("times", read.dates() ? "dates" : "day numbers")
                .row("origin", read.origin() == null ? "none" : read.origin() + " (day 0)");
        for (String[] l : lines) {
            table.row(l);
        }
        emit(json, table);
        return ExitCode.OK;
    }

    private static int sum(int[] a) {
        int s = 0;
        for (int x : a) {
            s += x;
        }
        return s;
    }

    private static void put(ObjectNode json, List<String[]> lines, String name, int value) {
        json.put(name, value);
        lines.add(new String[] {name, Integer.toString(value)});
    }

    private static void range(ObjectNode json, List<String[]> lines, ReadResult<?> r, String name, double[] t) {
        double lo = Double.POSITIVE_INFINITY;
        double hi = Double.NEGATIVE_INFINITY;
        for (double x : t) {
            lo = Math.min(lo, x);
            hi = Math.max(hi, x);
        }
        ObjectNode o = json.putObject(name + "Range");
        o.put("from", lo);
        o.put("to", hi);
        lines.add(new String[] {name + "Range", day(r, lo) + " to " + day(r, hi)});
    }

    private static String day(ReadResult<?> r, double t) {
        String s = "day " + TextTable.number(t);
        return r.origin() == null ? s : s + " (" + r.dateOf(t) + ")";
    }
}
