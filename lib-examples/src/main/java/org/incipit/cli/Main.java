package org.incipit.cli;

/** Entry point of the command-line application (commands arrive with the application issue). */
public final class Main {

    private Main() {
    }

    /** @param args command-line arguments */
    public static void main(String[] args) {
        System.err.println("incipit: the command-line application is not built yet");
        System.exit(2);
    }
}
