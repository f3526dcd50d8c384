package dev.driftlab.app.sharing;

import java.util.Locale;
import java.util.Optional;

/**
 * What a link lets its holder do, for every kind of thing shared by link (scenarios and suites):
 * the one place that says which access may change things.
 */
public enum Access {
    /** Open, run and read reports. */
    VIEW,
    /** Everything a view link does, plus saving revisions and managing links. */
    EDIT;

    /** The word stored in the database and used in URLs. */
    public String word() {
        return name().toLowerCase(Locale.ROOT);
    }

    /** Whether the holder may change what the link opens (its revisions and its links). */
    public boolean canEdit() {
        return this == EDIT;
    }

    /**
     * Nothing for an edit link; {@link ReadOnlyLink} with the given message for a view link.
     *
     * @param refusal what a view link of this kind of thing can do, and that it cannot change it
     */
    public void requireEdit(String refusal) {
        if (!canEdit()) {
            throw new ReadOnlyLink(refusal);
        }
    }

    /** The access for a URL or database word. */
    public static Optional<Access> of(String word) {
        for (Access a : values()) {
            if (a.word().equals(word)) {
                return Optional.of(a);
            }
        }
        return Optional.empty();
    }

    /** The access a URL path names; {@link LinkNotFound} for any other word, like a mistyped token. */
    public static Access inPath(String word) {
        return of(word).orElseThrow(LinkNotFound::new);
    }
}
