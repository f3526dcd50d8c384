package dev.driftlab.localizer.protocol;

import dev.driftlab.geometry.Pose;
import dev.driftlab.localizer.Covariance;
import dev.driftlab.localizer.LocalizerFailure.Kind;
import tools.jackson.databind.JsonNode;

/**
 * Reading one field of a message: present, of the right shape and finite, or a {@link
 * ProtocolException} naming the field's path ({@code estimate.pose.x}). {@link Messages} reads every
 * message with these.
 */
final class MessageFields {

    private MessageFields() {}

    static double optional(JsonNode n, String field) {
        JsonNode v = n.path(field);
        return v.isNumber() && Double.isFinite(v.asDouble()) ? v.asDouble() : Double.NaN;
    }

    static Covariance readCovariance(JsonNode parent, String path) {
        JsonNode c = parent.path("covariance");
        if (c.isMissingNode() || c.isNull()) {
            return Covariance.UNKNOWN;
        }
        if (!c.isArray() || c.size() != 6) {
            throw new ProtocolException(
                    Kind.MALFORMED, path + ".covariance must be a list of 6 numbers [xx, xy, xh, yy, yh, hh]");
        }
        double[] v = new double[6];
        for (int i = 0; i < 6; i++) {
            v[i] = finite(c.get(i), path + ".covariance[" + i + "]");
        }
        if (v[0] < 0 || v[3] < 0 || v[5] < 0) {
            throw new ProtocolException(Kind.MALFORMED, path + ".covariance has a negative variance");
        }
        return new Covariance(v[0], v[1], v[2], v[3], v[4], v[5]);
    }

    static Pose readPose(JsonNode parent, String field, String path) {
        JsonNode p = object(parent, field, path);
        return Pose.of(
                number(p, "x", path + ".x"), number(p, "y", path + ".y"), number(p, "heading", path + ".heading"));
    }

    static JsonNode object(JsonNode parent, String field, String path) {
        JsonNode v = parent.path(field);
        if (!v.isObject()) {
            throw new ProtocolException(
                    Kind.MALFORMED, path + (v.isMissingNode() ? " is missing" : " must be an object"));
        }
        return v;
    }

    static JsonNode array(JsonNode parent, String field, String path) {
        JsonNode v = parent.path(field);
        if (!v.isArray()) {
            throw new ProtocolException(Kind.MALFORMED, path + (v.isMissingNode() ? " is missing" : " must be a list"));
        }
        return v;
    }

    static String text(JsonNode parent, String field, String path) {
        JsonNode v = parent.path(field);
        if (!v.isString()) {
            throw new ProtocolException(Kind.MALFORMED, path + (v.isMissingNode() ? " is missing" : " must be text"));
        }
        return v.asString();
    }

    static double number(JsonNode parent, String field, String path) {
        JsonNode v = parent.path(field);
        if (v.isMissingNode()) {
            throw new ProtocolException(Kind.MALFORMED, path + " is missing");
        }
        return finite(v, path);
    }

    static int whole(JsonNode parent, String field, String path) {
        JsonNode v = parent.path(field);
        if (!v.isIntegralNumber() || !v.canConvertToInt()) {
            throw new ProtocolException(
                    Kind.MALFORMED, path + (v.isMissingNode() ? " is missing" : " must be a whole number"));
        }
        return v.asInt();
    }

    static double finite(JsonNode v, String path) {
        if (v == null || !v.isNumber()) {
            throw new ProtocolException(Kind.MALFORMED, path + " must be a number");
        }
        double d = v.asDouble();
        if (!Double.isFinite(d)) {
            throw new ProtocolException(Kind.NOT_FINITE, path + " is " + d + "; numbers must be finite");
        }
        return d;
    }

    static String clip(String s) {
        String t = s == null ? "" : s.strip();
        return t.length() > 120 ? t.substring(0, 120) + "..." : t;
    }
}
