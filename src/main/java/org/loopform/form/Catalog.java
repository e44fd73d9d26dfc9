package org.loopform.form;

import java.util.Collection;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;

/** The forms loopform ships, by id, in id order. */
public final class Catalog {
    private final Map<String, FormDefinition> forms;

    public Catalog(Collection<FormDefinition> forms) {
        Map<String, FormDefinition> m = new LinkedHashMap<>();
        forms.stream().sorted(java.util.Comparator.comparing(FormDefinition::id)).forEach(f -> {
            if (m.put(f.id(), f) != null) {
                throw new FormException("the catalog holds two forms with id " + f.id());
            }
        });
        this.forms = java.util.Collections.unmodifiableMap(m);
    }

    public Optional<FormDefinition> find(String id) {
        return Optional.ofNullable(forms.get(id));
    }

    public List<FormDefinition> all() {
        return List.copyOf(forms.values());
    }

    public List<String> ids() {
        return List.copyOf(forms.keySet());
    }
}
