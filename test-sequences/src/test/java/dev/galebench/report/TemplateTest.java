package dev.galebench.report;

import org.junit.jupiter.api.Test;

import java.util.Map;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

class TemplateTest {
    @Test
    void shouldEscapeDoubleBracesAndInsertTripleBracesAsIs() {
        String row = Template.of("kv-row.html").render(Map.of("key", "a<b", "value", "\"x\" & 'y'", "row_class", ""));
        assertEquals("      <tr class=\"\"><th>a&lt;b</th><td class=\"mono\">&quot;x&quot; &amp; &#39;y&#39;</td></tr>\n", row);
        String table = Template.of("link-table.html").render(Map.of("rows", "<tr><td>1</td></tr>"));
        assertTrue(table.contains("<tr><td>1</td></tr>"));
    }

    @Test
    void shouldRefuseAPlaceholderWithoutValueAndAMissingTemplate() {
        IllegalStateException e = assertThrows(IllegalStateException.class,
                () -> Template.of("kv-row.html").render(Map.of("key", "k", "value", "v")));
        assertEquals("kv-row.html: no value for placeholder 'row_class'", e.getMessage());
        assertThrows(IllegalStateException.class, () -> Template.of("no-such-template.html"));
    }
}
