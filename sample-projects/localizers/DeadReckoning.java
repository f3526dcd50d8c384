// A localizer for Driftlab's open protocol driftlab-localizer/1 (docs/localizer-protocol.md) that
// only integrates odometry from the start hint. It never looks at a scan, so it cannot notice a
// kidnap or a stalled wheel: run it to see what a batch report of a failing localizer looks like.
//
//   java -jar driftlab.jar batch sample-projects/storage-hall-kidnap.json --out out \
//        --localizer "java sample-projects/localizers/DeadReckoning.java"
//
// A single-file program: only the JDK, started with `java DeadReckoning.java`. It reads one JSON
// message per line on standard input and answers on standard output; anything for people goes to
// standard error.

import java.io.BufferedReader;
import java.io.InputStreamReader;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

public class DeadReckoning {

    static final String PROTOCOL = "driftlab-localizer/1";

    public static void main(String[] args) throws Exception {
        BufferedReader in = new BufferedReader(new InputStreamReader(System.in, StandardCharsets.UTF_8));
        PrintStream out = new PrintStream(System.out, false, StandardCharsets.UTF_8);
        String line = in.readLine();
        if (line == null) {
            System.err.println("DeadReckoning: no greeting");
            System.exit(2);
        }
        Map<?, ?> greeting = (Map<?, ?>) new Json(line).value();
        if (!PROTOCOL.equals(greeting.get("protocol"))) {
            String reason = "DeadReckoning speaks " + PROTOCOL + " only, not " + greeting.get("protocol");
            System.err.println(reason);
            out.println("{\"type\":\"refused\",\"reason\":\"" + reason.replace("\"", "'") + "\"}");
            out.flush();
            System.exit(2);
        }
        double x = 0, y = 0, heading = 0;
        if (greeting.get("start") instanceof Map<?, ?> start) {
            Map<?, ?> pose = (Map<?, ?>) start.get("pose");
            x = num(pose.get("x"));
            y = num(pose.get("y"));
            heading = num(pose.get("heading"));
        } else {
            System.err.println("DeadReckoning: the start is unknown; starting at (0, 0), which will be wrong");
        }
        out.println("{\"type\":\"hello\",\"name\":\"dead reckoning (sample)\",\"protocol\":\"" + PROTOCOL + "\"}");
        out.flush();
        while ((line = in.readLine()) != null) {
            if (line.isBlank()) {
                continue;
            }
            Map<?, ?> m = (Map<?, ?>) new Json(line).value();
            switch (String.valueOf(m.get("type"))) {
                case "odometry" -> {
                    // the increment is in the frame of the previous odometry pose: forward, left, turn
                    Map<?, ?> d = (Map<?, ?>) m.get("increment");
                    double f = num(d.get("forward"));
                    double l = num(d.get("left"));
                    x += Math.cos(heading) * f - Math.sin(heading) * l;
                    y += Math.sin(heading) * f + Math.cos(heading) * l;
                    heading = Math.atan2(Math.sin(heading + num(d.get("turn"))), Math.cos(heading + num(d.get("turn"))));
                }
                case "scan" -> {
                    out.println("{\"type\":\"estimate\",\"time\":" + num(m.get("time")) + ",\"pose\":{\"x\":" + x
                            + ",\"y\":" + y + ",\"heading\":" + heading + "}}");
                    out.flush();
                }
                case "end" -> {
                    return;
                }
                default -> System.err.println("DeadReckoning: ignoring a " + m.get("type") + " message");
            }
        }
    }

    static double num(Object o) {
        return ((Number) o).doubleValue();
    }

    /** A small JSON reader: objects, arrays, strings, numbers, true, false, null. */
    static final class Json {
        private final String s;
        private int i;

        Json(String s) {
            this.s = s;
        }

        Object value() {
            skip();
            char c = s.charAt(i);
            if (c == '{') {
                Map<String, Object> m = new LinkedHashMap<>();
                i++;
                skip();
                if (s.charAt(i) == '}') {
                    i++;
                    return m;
                }
                while (true) {
                    skip();
                    String key = string();
                    skip();
                    expect(':');
                    m.put(key, value());
                    skip();
                    if (s.charAt(i++) == '}') {
                        return m;
                    }
                }
            }
            if (c == '[') {
                List<Object> a = new ArrayList<>();
                i++;
                skip();
                if (s.charAt(i) == ']') {
                    i++;
                    return a;
                }
                while (true) {
                    a.add(value());
                    skip();
                    if (s.charAt(i++) == ']') {
                        return a;
                    }
                }
            }
            if (c == '"') {
                return string();
            }
            if (s.startsWith("true", i)) {
                i += 4;
                return Boolean.TRUE;
            }
            if (s.startsWith("false", i)) {
                i += 5;
                return Boolean.FALSE;
            }
            if (s.startsWith("null", i)) {
                i += 4;
                return null;
            }
            int start = i;
            while (i < s.length() && "+-0123456789.eE".indexOf(s.charAt(i)) >= 0) {
                i++;
            }
            return Double.parseDouble(s.substring(start, i));
        }

        private String string() {
            expect('"');
            StringBuilder b = new StringBuilder();
            while (true) {
                char c = s.charAt(i++);
                if (c == '"') {
                    return b.toString();
                }
                if (c == '\\') {
                    char e = s.charAt(i++);
                    switch (e) {
                        case 'n' -> b.append('\n');
                        case 't' -> b.append('\t');
                        case 'r' -> b.append('\r');
                        case 'b' -> b.append('\b');
                        case 'f' -> b.append('\f');
                        case 'u' -> {
                            b.append((char) Integer.parseInt(s.substring(i, i + 4), 16));
                            i += 4;
                        }
                        default -> b.append(e);
                    }
                } else {
                    b.append(c);
                }
            }
        }

        private void expect(char c) {
            if (s.charAt(i++) != c) {
                throw new IllegalArgumentException("expected '" + c + "' at " + (i - 1));
            }
        }

        private void skip() {
            while (i < s.length() && Character.isWhitespace(s.charAt(i))) {
                i++;
            }
        }
    }
}
