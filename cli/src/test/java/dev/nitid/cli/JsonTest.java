package dev.nitid.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Assumptions;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** JSON output against RFC 8259 rules, and parsed back by Python's json module (stdlib) when present. */
class JsonTest {

    @Test
    void escapesAndWritesNonFiniteAsNull() {
        String s = Json.object().put("a\"b", "x\\y\n\u0001").put("nan", Double.NaN).put("n", 2.0)
                .put("f", 0.25).toString();
        assertTrue(s.contains("\"a\\\"b\": \"x\\\\y\\n\\u0001\""), s);
        assertTrue(s.contains("\"nan\": null"), s);
        assertTrue(s.contains("\"n\": 2,"), s);
        assertTrue(s.contains("\"f\": 0.25"), s);
    }

    @Test
    void pythonReadsItBack(@TempDir Path dir) throws Exception {
        Path py = Path.of("/usr/bin/python3");
        Assumptions.assumeTrue(Files.isExecutable(py), "python3 not installed");
        String s = Json.object().put("list", List.of(1, 2.5, "three")).put("map", Map.of("k", true))
                .put("nested", Json.object().put("x", (Object) null)).toString();
        Path f = dir.resolve("o.json");
        Files.writeString(f, s);
        Process p = new ProcessBuilder(py.toString(), "-c",
                "import json,sys; o=json.load(open(sys.argv[1])); "
                        + "print(o['list'][1], o['map']['k'], o['nested']['x'])", f.toString())
                .redirectErrorStream(true).start();
        String out = new String(p.getInputStream().readAllBytes()).trim();
        assertEquals(0, p.waitFor(), out);
        assertEquals("2.5 True None", out);
    }
}
