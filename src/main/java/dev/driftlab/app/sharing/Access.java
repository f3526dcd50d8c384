package dev.driftlab.app.sharing;

import java.util.Locale;

/** What a link lets its holder do. */
public enum Access {
    /** Open, run and read reports. */
    VIEW,
    /** Everything a view link does, plus saving revisions and managing links. */
    EDIT;

    /** The word stored in the database and used in URLs. */
    public String word() {
        return name().toLowerCase(Locale.ROOT);
    }

    /** The access for a URL or database word. */
    public static java.util.Optional<Access> of(String word) {
        for (Access a : values()) {
            if (a.word().equals(word)) {
                return java.util.Optional.of(a);
            }
        }
        return java.util.Optional.empty();
    }
}
