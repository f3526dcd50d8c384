package dev.driftlab.scenario;

import java.util.Collection;
import java.util.Locale;
import java.util.Map;
import tools.jackson.core.JacksonException;
import tools.jackson.core.TokenStreamLocation;
import tools.jackson.core.exc.StreamConstraintsException;
import tools.jackson.core.exc.StreamReadException;
import tools.jackson.databind.exc.MismatchedInputException;
import tools.jackson.databind.exc.UnrecognizedPropertyException;

/**
 * What is wrong with a JSON text, in our words: the JSON library's messages name its own classes,
 * settings and limits, which mean nothing to someone fixing a file or a request.
 */
public final class JsonTrouble {

    private JsonTrouble() {}

    /** The field path of the failure ({@code options.seeds[2]}), empty for the document as a whole. */
    public static String path(JacksonException e) {
        StringBuilder sb = new StringBuilder();
        for (JacksonException.Reference r : e.getPath()) {
            if (r.getPropertyName() != null) {
                if (sb.length() > 0) {
                    sb.append('.');
                }
                sb.append(r.getPropertyName());
            } else if (r.getIndex() >= 0) {
                sb.append('[').append(r.getIndex()).append(']');
            }
        }
        return sb.toString();
    }

    /** A plain sentence for the failure, without the path. */
    public static String describe(JacksonException e) {
        if (e instanceof StreamConstraintsException) {
            return "is nested too deeply or holds a value too long to read";
        }
        if (e instanceof UnrecognizedPropertyException) {
            return "is not a field this document has";
        }
        if (e instanceof MismatchedInputException m) {
            return "expected " + kind(m.getTargetType());
        }
        String original =
                e.getOriginalMessage() == null ? "" : e.getOriginalMessage().toLowerCase(Locale.ROOT);
        String where = where(e.getLocation());
        if (e instanceof StreamReadException) {
            if (original.contains("end-of-input")) {
                return "ends too early" + where + " (a bracket, brace or quote left open?)";
            }
            if (original.contains("trailing token")) {
                return "has more after the end of the JSON value" + where;
            }
            return "is not valid JSON" + where;
        }
        return "could not be read" + where;
    }

    private static String where(TokenStreamLocation loc) {
        return loc == null || loc.getLineNr() < 1
                ? ""
                : " at line " + loc.getLineNr() + ", column " + loc.getColumnNr();
    }

    private static String kind(Class<?> type) {
        if (type == null) {
            return "a different kind of value";
        }
        if (CharSequence.class.isAssignableFrom(type) || type == char.class || type == Character.class) {
            return "text";
        }
        if (type == boolean.class || type == Boolean.class) {
            return "true or false";
        }
        if (type.isPrimitive() || Number.class.isAssignableFrom(type)) {
            return "a number";
        }
        if (type.isArray() || Collection.class.isAssignableFrom(type)) {
            return "a list";
        }
        if (Map.class.isAssignableFrom(type) || type.isRecord()) {
            return "an object";
        }
        return "a different kind of value";
    }
}
