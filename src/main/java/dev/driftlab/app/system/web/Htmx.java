package dev.driftlab.app.system.web;

/**
 * Whether a request came from htmx (it sends the {@code HX-Request} header), for handlers that answer
 * a fragment to htmx and the whole page otherwise. Take it as a handler parameter: {@link HtmxArgument}
 * reads the header and marks the response {@code Vary: HX-Request}, so a cache never serves a fragment
 * for a page or the other way round.
 */
public record Htmx(boolean request) {

    /** The header htmx sends on every request it makes. */
    public static final String HEADER = "HX-Request";

    /** The view to answer with: the fragment for htmx, the page otherwise. */
    public String view(String page, String fragment) {
        return request ? fragment : page;
    }
}
