package dev.nitid.cli;

import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * A small JSON object builder for the CLI's machine-readable output (RFC 8259). Keys keep their
 * insertion order; non-finite numbers are written as {@code null}, since JSON has no NaN or infinity.
 */
final class Json {
    private final Map<String, Object> fields = new LinkedHashMap<>();

    /** @return a new empty object */
    static Json object() {
        return new Json();
    }

    /**
     * Adds a field. Values may be null, String, Number, Boolean, Json, a List or a Map of these.
     *
     * @return this object
     */
    Json put(String key, Object value) {
        fields.put(key, value);
        return this;
    }

    @Override
    public String toString() {
        StringBuilder sb = new StringBuilder();
        write(sb, this, 0);
        return sb.toString();
    }

    private static void write(StringBuilder sb, Object v, int indent) {
        if (v == null) {
            sb.append("null");
        } else if (v instanceof Json j) {
            writeMap(sb, j.fields, indent);
        } else if (v instanceof Map<?, ?> m) {
            writeMap(sb, m, indent);
        } else if (v instanceof List<?> list) {
            if (list.isEmpty()) {
                sb.append("[]");
                return;
            }
            sb.append("[\n");
            for (int i = 0; i < list.size(); i++) {
                pad(sb, indent + 2);
                write(sb, list.get(i), indent + 2);
                sb.append(i + 1 < list.size() ? ",\n" : "\n");
            }
            pad(sb, indent);
            sb.append(']');
        } else if (v instanceof Double || v instanceof Float) {
            double d = ((Number) v).doubleValue();
            if (!Double.isFinite(d)) {
                sb.append("null");
            } else if (d == Math.rint(d) && Math.abs(d) < 1e15) {
                sb.append((long) d);
            } else {
                sb.append(d);
            }
        } else if (v instanceof Number || v instanceof Boolean) {
            sb.append(v);
        } else {
            quote(sb, v.toString());
        }
    }

    private static void writeMap(StringBuilder sb, Map<?, ?> m, int indent) {
        if (m.isEmpty()) {
            sb.append("{}");
            return;
        }
        sb.append("{\n");
        int i = 0;
        for (Map.Entry<?, ?> e : m.entrySet()) {
            pad(sb, indent + 2);
            quote(sb, String.valueOf(e.getKey()));
            sb.append(": ");
            write(sb, e.getValue(), indent + 2);
            sb.append(++i < m.size() ? ",\n" : "\n");
        }
        pad(sb, indent);
        sb.append('}');
    }

    private static void pad(StringBuilder sb, int n) {
        sb.append(" ".repeat(n));
    }

    private static void quote(StringBuilder sb, String s) {
        sb.append('"');
        for (int i = 0; i < s.length(); i++) {
            char c = s.charAt(i);
            switch (c) {
                case '"' -> sb.append("\\\"");
                case '\\' -> sb.append("\\\\");
                case '\n' -> sb.append("\\n");
                case '\r' -> sb.append("\\r");
                case '\t' -> sb.append("\\t");
                default -> {
                    if (c < 0x20) {
                        sb.append(String.format("\\u%04x", (int) c));
                    } else {
                        sb.append(c);
                    }
                }
            }
        }
        sb.append('"');
    }
}
