package org.incipit.io;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.ByteBuffer;
import java.nio.charset.CharacterCodingException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVParser;
import org.apache.commons.csv.CSVRecord;

/** A CSV file read into memory: header and data rows with their line numbers. */
final class CsvTable {

    /**
     * One data row: 1-based line number where it starts, its trimmed values, and a fault if the
     * number of values differs from the header (then {@code values} is empty).
     */
    record Row(int line, String[] values, String fault) {
    }

    private static final CSVFormat FORMAT = CSVFormat.RFC4180.builder()
            .setHeader()
            .setSkipHeaderRecord(true)
            .setCommentMarker('#')
            .setIgnoreEmptyLines(true)
            .setIgnoreSurroundingSpaces(true)
            .setTrim(true)
            .setAllowMissingColumnNames(true)
            .build();

    final String file;
    final int headerLine;
    final List<String> columns;  // lower case, header order
    final List<Row> rows;
    private final Map<String, Integer> index = new HashMap<>();

    private CsvTable(String file, int headerLine, List<String> columns, List<Row> rows) {
        this.file = file;
        this.headerLine = headerLine;
        this.columns = columns;
        this.rows = rows;
        for (int i = 0; i < columns.size(); i++) {
            index.put(columns.get(i), i);
        }
    }

    /**
     * Reads the file and checks the header: required columns present, no unknown or duplicate
     * column, at least one data row.
     */
    static CsvTable read(Path path, List<String> required, List<String> optional) {
        String file = path.toString();
        String text;
        try {
            text = StandardCharsets.UTF_8.newDecoder()
                    .decode(ByteBuffer.wrap(Files.readAllBytes(path))).toString();
        } catch (CharacterCodingException e) {
            throw new InputException(file, 0, 0, "not valid UTF-8 text");
        } catch (IOException e) {
            throw new InputException(file, "cannot read the file (" + e.getClass().getSimpleName() + ": "
                    + e.getMessage() + ")", e);
        }
        if (text.startsWith("\uFEFF")) {
            text = text.substring(1);
        }
        String expected = String.join(",", required);
        List<String> columns = new ArrayList<>();
        List<Row> rows = new ArrayList<>();
        int headerLine;
        try (CSVParser parser = CSVParser.parse(text, FORMAT)) {
            List<String> header = parser.getHeaderNames();
            headerLine = (int) parser.getCurrentLineNumber();
            if (header.isEmpty()) {
                throw new InputException(file, 0, 0, "empty file (expected a header line: " + expected + ")");
            }
            for (int i = 0; i < header.size(); i++) {
                String name = header.get(i).trim().toLowerCase(Locale.ROOT);
                if (name.isEmpty()) {
                    throw new InputException(file, headerLine, i + 1, "header: column " + (i + 1) + " has no name");
                }
                if (columns.contains(name)) {
                    throw new InputException(file, headerLine, i + 1, "header: column '" + name
                            + "' appears twice");
                }
                if (!required.contains(name) && !optional.contains(name)) {
                    List<String> known = new ArrayList<>(required);
                    known.addAll(optional);
                    throw new InputException(file, headerLine, i + 1, "header: unknown column '" + name
                            + "' (known columns: " + String.join(", ", known) + ")");
                }
                columns.add(name);
            }
            for (String r : required) {
                if (!columns.contains(r)) {
                    throw new InputException(file, headerLine, 0, "header: missing column '" + r
                            + "' (required columns: " + expected + ")");
                }
            }
            for (CSVRecord record : parser) {
                String[] values = record.values();
                int newlines = 0;
                for (String v : values) {
                    newlines += (int) v.chars().filter(c -> c == '\n').count();
                }
                int line = (int) parser.getCurrentLineNumber() - newlines;
                if (values.length != columns.size()) {
                    // a row fault, not a file fault: it can be skipped
                    rows.add(new Row(line, new String[0], "row has " + values.length
                            + (values.length == 1 ? " value" : " values") + ", the header has "
                            + columns.size() + " columns"));
                } else {
                    rows.add(new Row(line, values, null));
                }
            }
        } catch (IOException | UncheckedIOException | IllegalStateException | IllegalArgumentException e) {
            throw new InputException(file, "malformed CSV (" + e.getMessage() + ")", e);
        }
        if (rows.isEmpty()) {
            throw new InputException(file, 0, 0, "no data rows (only a header"
                    + (headerLine > 0 ? " on line " + headerLine : "") + ")");
        }
        return new CsvTable(file, headerLine, columns, rows);
    }

    boolean has(String column) {
        return index.containsKey(column);
    }

    /** @return 1-based column number */
    int number(String column) {
        return index.get(column) + 1;
    }

    String value(Row row, String column) {
        return row.values()[index.get(column)];
    }

}
