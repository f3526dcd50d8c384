package dev.driftlab.app.scenarios.web;

import org.springframework.web.multipart.MultipartFile;

/** Form data of the scenario pages, bound by Spring and turned into store calls; never core types. */
final class Forms {

    private Forms() {}

    /** Author name used when the form leaves it empty. */
    static final String NO_AUTHOR = "anonymous";

    /**
     * The JSON edit form.
     *
     * @param baseRevision the revision the text was loaded from
     * @param author free-text name
     * @param message what changed and why
     * @param document the scenario JSON
     */
    record RevisionForm(Integer baseRevision, String author, String message, String document) {
        String authorOrDefault() {
            return author == null || author.isBlank() ? NO_AUTHOR : author;
        }

        String messageOrEmpty() {
            return message == null ? "" : message;
        }

        String documentOrEmpty() {
            return document == null ? "" : document;
        }
    }

    /**
     * The import form.
     *
     * @param file the uploaded JSON file
     * @param author free-text name
     */
    record ImportForm(MultipartFile file, String author) {
        String authorOrDefault() {
            return author == null || author.isBlank() ? NO_AUTHOR : author;
        }
    }

    /**
     * The "new from a sample" form.
     *
     * @param sample sample file name
     * @param author free-text name
     */
    record SampleForm(String sample, String author) {
        String authorOrDefault() {
            return author == null || author.isBlank() ? NO_AUTHOR : author;
        }
    }
}
