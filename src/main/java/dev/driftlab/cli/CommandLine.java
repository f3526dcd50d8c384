package dev.driftlab.cli;

import dev.driftlab.cli.Options.UsageException;
import dev.driftlab.localizer.protocol.CommandWords;
import java.util.List;

/** A command given as one option's value, split by {@link CommandWords} (the server's allow-list uses the same rule). */
final class CommandLine {

    private CommandLine() {}

    /**
     * The words of a command.
     *
     * @param option the option the command came from, for messages
     * @param text the command
     * @throws UsageException for an empty command or an unclosed quote
     */
    static List<String> split(String option, String text) {
        try {
            return CommandWords.split("--" + option, text);
        } catch (IllegalArgumentException e) {
            throw new UsageException(e.getMessage());
        }
    }
}
