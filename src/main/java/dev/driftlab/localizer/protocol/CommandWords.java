package dev.driftlab.localizer.protocol;

import java.util.ArrayList;
import java.util.List;

/**
 * Splits a command given as one argument ({@code --localizer "java DeadReckoning.java --noise 0.1"})
 * into words the way a POSIX shell splits simple quoting: blanks separate words, single quotes keep
 * everything literally, double quotes keep blanks and let a backslash escape {@code "} and
 * {@code \}, and outside quotes a backslash escapes the next character. Nothing else is
 * interpreted (no variables, globs, pipes or redirections), and the words are never handed to a
 * shell.
 */
public final class CommandWords {

    private CommandWords() {}

    /**
     * The words of a command.
     *
     * @param setting where the command came from, as the message should name it (e.g. {@code --localizer})
     * @param text the command
     * @throws IllegalArgumentException for an empty command or an unclosed quote
     */
    public static List<String> split(String setting, String text) {
        List<String> words = new ArrayList<>();
        StringBuilder word = new StringBuilder();
        boolean inWord = false;
        char quote = 0;
        for (int i = 0; i < text.length(); i++) {
            char c = text.charAt(i);
            if (quote == '\'') {
                if (c == '\'') {
                    quote = 0;
                } else {
                    word.append(c);
                }
            } else if (quote == '"') {
                if (c == '"') {
                    quote = 0;
                } else if (c == '\\'
                        && i + 1 < text.length()
                        && (text.charAt(i + 1) == '"' || text.charAt(i + 1) == '\\')) {
                    word.append(text.charAt(++i));
                } else {
                    word.append(c);
                }
            } else if (c == '\'' || c == '"') {
                quote = c;
                inWord = true;
            } else if (c == '\\' && i + 1 < text.length()) {
                word.append(text.charAt(++i));
                inWord = true;
            } else if (Character.isWhitespace(c)) {
                if (inWord) {
                    words.add(word.toString());
                    word.setLength(0);
                    inWord = false;
                }
            } else {
                word.append(c);
                inWord = true;
            }
        }
        if (quote != 0) {
            throw new IllegalArgumentException(
                    setting + " has an unclosed " + (quote == '"' ? "double" : "single") + " quote");
        }
        if (inWord) {
            words.add(word.toString());
        }
        if (words.isEmpty()) {
            throw new IllegalArgumentException(setting + " needs a command, e.g. \"java MyLocalizer.java\"");
        }
        return words;
    }
}
