package org.incipit.cli;

import picocli.CommandLine.Option;

/** Output options shared by every command ({@code @Mixin}). */
public final class OutputOptions {

    @Option(names = "--json", description = "Write one JSON object on stdout instead of a table.")
    boolean json;

    /** Creates the options with their defaults. */
    public OutputOptions() {
    }

    /** @return true if output is JSON */
    public boolean json() {
        return json;
    }
}
