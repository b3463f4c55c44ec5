package org.incipit.cli;

import java.io.PrintWriter;
import java.io.StringWriter;

/** A captured run of the command line. */
record CliRun(int code, String out, String err) {

    static final String NL = System.lineSeparator();

    static CliRun of(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = Main.run(new PrintWriter(out), new PrintWriter(err), args);
        return new CliRun(code, out.toString(), err.toString());
    }
}
