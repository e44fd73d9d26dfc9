// plumbing: no published source needed (source: none)
package org.loopform.io;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.catchThrowableOfType;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Set;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * YAML read into located nodes: the byte-order mark, the limits (aliases, nesting), duplicate
 * keys at any depth, control characters located by line, and the node accessors' messages. The
 * alias and nesting limits guard against the "billion laughs" expansion (OWASP, XML/YAML entity
 * expansion, common practice).
 */
class YamlSourceTest {

    @Test
    void a_byte_order_mark_is_not_part_of_the_first_key() {
        YamlNode root = YamlSource.parse("\uFEFFid: x\n", "f.yaml");
        assertThat(root.entries()).containsOnlyKeys("id");
        assertThat(root.get("id").orElseThrow().text()).isEqualTo("x");
    }

    @Test
    void an_empty_document_says_so_on_line_1() {
        assertThatThrownBy(() -> YamlSource.parse("# nothing\n", "f.yaml")).hasMessageStartingWith("f.yaml:1: the file is empty");
    }

    @Test
    void duplicate_keys_are_found_inside_lists_too() {
        InputException e = catchThrowableOfType(InputException.class, () -> YamlSource.parse("""
                loops:
                  - tag: a
                    tag: b
                """, "f.yaml"));
        assertThat(e.problems()).singleElement().satisfies(p -> assertThat(p)
                .isEqualTo("f.yaml:3: loops[0].tag: duplicate key (first given on line 2); give each key once"));
    }

    @Test
    void more_than_twenty_aliases_to_collections_are_refused() {
        StringBuilder y = new StringBuilder("a: &x [1, 2]\nb: [");
        for (int k = 0; k < 25; k++) {
            y.append(k == 0 ? "" : ", ").append("*x");
        }
        y.append("]\n");
        assertThatThrownBy(() -> YamlSource.parse(y.toString(), "f.yaml"))
                .hasMessageContaining("f.yaml: more than 20 aliases");
        // a few aliases are fine
        assertThat(YamlSource.parse("a: &x [1, 2]\nb: [*x, *x]\n", "f.yaml").get("b").orElseThrow().items()).hasSize(2);
    }

    @Test
    void nesting_deeper_than_fifty_levels_is_refused() {
        String deep = "[".repeat(60) + "]".repeat(60) + "\n";
        assertThatThrownBy(() -> YamlSource.parse(deep, "f.yaml")).hasMessageContaining("nested more than 50 levels");
        String fine = "[".repeat(10) + "]".repeat(10) + "\n";
        assertThat(YamlSource.parse(fine, "f.yaml").isSequence()).isTrue();
    }

    @Test
    void a_control_character_is_located_by_its_line() {
        assertThatThrownBy(() -> YamlSource.parse("id: x\ntitle: t\nstructure: a\u0007b\n", "f.yaml"))
                .hasMessageStartingWith("f.yaml:3: a control character (code 7)");
    }

    @Test
    void bad_yaml_names_its_line_and_an_undefined_alias_says_what_it_needs() {
        assertThatThrownBy(() -> YamlSource.parse("a: 1\nb: [1, 2\n", "f.yaml")).hasMessageContaining("not valid YAML");
        assertThatThrownBy(() -> YamlSource.parse("a: 1\nb: *nowhere\n", "f.yaml"))
                .hasMessageStartingWith("f.yaml:2: not valid YAML")
                .hasMessageContaining("needs its anchor (&name)");
    }

    @Test
    void a_file_is_read_and_a_folder_or_a_missing_file_is_named(@TempDir Path dir) throws IOException {
        Path f = dir.resolve("a.yaml");
        Files.writeString(f, "id: x\n");
        assertThat(YamlSource.read(f, "a.yaml").get("id").orElseThrow().text()).isEqualTo("x");
        assertThatThrownBy(() -> YamlSource.read(dir, "d")).hasMessage("d: is a folder, not a file; give the path of the file itself");
        assertThatThrownBy(() -> YamlSource.read(dir.resolve("none.yaml"), "none.yaml"))
                .hasMessage("none.yaml: no such file; check the path");
    }

    @Test
    void nodes_say_where_they_are_and_what_they_expected() {
        YamlNode root = YamlSource.parse("""
                a: 1
                b:
                  - x
                  - {c: 2}
                """, "f.yaml");
        assertThat(root.isMapping()).isTrue();
        YamlNode b = root.get("b").orElseThrow();
        assertThat(b.isSequence()).isTrue();
        assertThat(b.line()).isEqualTo(3);
        assertThat(b.where()).isEqualTo("f.yaml:3: b: ");
        assertThat(root.where()).isEqualTo("f.yaml:1: ");
        YamlNode c = b.items().get(1).get("c").orElseThrow();
        assertThat(c.path()).isEqualTo("b[1].c");
        assertThat(c.isScalar()).isTrue();
        assertThat(root.get("z")).isEmpty();
        assertThatThrownBy(b::text).hasMessage("f.yaml:3: b: expected a single value (got a list)");
        assertThatThrownBy(root::text).hasMessage("f.yaml:1: expected a single value (got a mapping)");
        assertThatThrownBy(b::entries).hasMessageContaining("expected a mapping of keys to values (got a list)");
        assertThatThrownBy(root.get("a").orElseThrow()::items).hasMessage("f.yaml:1: a: expected a list (got a value)");
        assertThat(root.unknownKeys(Set.of("a", "b"))).isEmpty();
        YamlNode flat = YamlSource.parse("a: 1\nz: 2\n", "f.yaml");
        assertThat(flat.unknownKeys(Set.of("b", "a"))).containsExactly("f.yaml:2: z: unknown key; expected one of a, b");
    }

    @Test
    void a_duplicate_key_in_a_later_list_item_names_that_item() {
        InputException e = catchThrowableOfType(InputException.class, () -> YamlSource.parse("""
                loops:
                  - tag: a
                  - tag: b
                    tag: c
                """, "f.yaml"));
        assertThat(e.problems()).singleElement().satisfies(p -> assertThat(p).startsWith("f.yaml:4: loops[1].tag:"));
    }

    @Test
    void a_control_character_at_the_end_of_a_line_is_on_that_line() {
        assertThatThrownBy(() -> YamlSource.parse("id: x\ntitle: t\u0007\nstructure: a\n", "f.yaml"))
                .hasMessageStartingWith("f.yaml:2: a control character (code 7)");
    }

    @Test
    void bad_yaml_other_than_an_alias_points_at_indentation_and_quoting() {
        assertThatThrownBy(() -> YamlSource.parse("a: 1\nb: [1, 2\n", "f.yaml"))
                .hasMessageContaining("; check indentation and quoting near this line")
                .hasMessageNotContaining("anchor");
    }

    @Test
    void a_document_over_8_mi_characters_is_refused_with_the_limit(@org.junit.jupiter.api.io.TempDir Path dir)
            throws IOException {
        Path f = dir.resolve("big.yaml");
        Files.writeString(f, "a: \"" + "x".repeat((8 << 20) + 10) + "\"\n");
        assertThatThrownBy(() -> YamlSource.read(f, "big.yaml"))
                .hasMessageStartingWith("big.yaml: larger than 8 Mi characters, the limit for a form");
    }
}
