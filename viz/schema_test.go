package viz

import (
	"bytes"
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"reflect"
	"sort"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/network"
	"github.com/heatgraph/heatgraph/solve"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// A validator for the subset of JSON Schema draft 2020-12 that
// docs/report.schema.json uses: type (one name or a list), const, enum,
// required, properties, additionalProperties (false or a schema), items,
// $ref to "#/$defs/…", minimum and maximum, and the annotations $schema,
// title and description. Any other keyword is an error, so the schema
// cannot silently use more than is checked.
type schemaValidator struct {
	root map[string]any
	errs []string
}

var knownKeywords = map[string]bool{"$schema": true, "title": true, "description": true, "$defs": true, "type": true,
	"const": true, "enum": true, "required": true, "properties": true, "additionalProperties": true, "items": true,
	"$ref": true, "minimum": true, "maximum": true}

func (v *schemaValidator) fail(path, format string, args ...any) {
	v.errs = append(v.errs, path+": "+fmt.Sprintf(format, args...))
}

func jsonType(x any) string {
	switch x := x.(type) {
	case nil:
		return "null"
	case bool:
		return "boolean"
	case string:
		return "string"
	case float64:
		if x == float64(int64(x)) {
			return "integer"
		}
		return "number"
	case []any:
		return "array"
	case map[string]any:
		return "object"
	}
	return "unknown"
}

func typeMatches(want, got string) bool {
	return want == got || (want == "number" && got == "integer")
}

func (v *schemaValidator) check(schema map[string]any, x any, path string) {
	keys := make([]string, 0, len(schema))
	for k := range schema {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	for _, k := range keys {
		if !knownKeywords[k] {
			v.fail(path, "schema keyword %q is not supported by this validator", k)
		}
	}
	if ref, ok := schema["$ref"].(string); ok {
		name, found := strings.CutPrefix(ref, "#/$defs/")
		defs, _ := v.root["$defs"].(map[string]any)
		target, ok := defs[name].(map[string]any)
		if !found || !ok {
			v.fail(path, "unresolved $ref %q", ref)
			return
		}
		v.check(target, x, path)
	}
	if t, ok := schema["type"]; ok {
		var names []string
		switch t := t.(type) {
		case string:
			names = []string{t}
		case []any:
			for _, n := range t {
				names = append(names, n.(string))
			}
		}
		got := jsonType(x)
		match := false
		for _, n := range names {
			match = match || typeMatches(n, got)
		}
		if !match {
			v.fail(path, "is %s, want %s", got, strings.Join(names, " or "))
			return
		}
	}
	if c, ok := schema["const"]; ok && !reflect.DeepEqual(c, x) {
		v.fail(path, "is %v, want %v", x, c)
	}
	if e, ok := schema["enum"].([]any); ok {
		found := false
		for _, c := range e {
			found = found || reflect.DeepEqual(c, x)
		}
		if !found {
			v.fail(path, "%v is not one of %v", x, e)
		}
	}
	if n, ok := x.(float64); ok {
		if m, ok := schema["minimum"].(float64); ok && n < m {
			v.fail(path, "%v is below the minimum %v", n, m)
		}
		if m, ok := schema["maximum"].(float64); ok && n > m {
			v.fail(path, "%v is above the maximum %v", n, m)
		}
	}
	if obj, ok := x.(map[string]any); ok {
		if req, ok := schema["required"].([]any); ok {
			for _, r := range req {
				if _, ok := obj[r.(string)]; !ok {
					v.fail(path, "missing required key %q", r)
				}
			}
		}
		props, _ := schema["properties"].(map[string]any)
		for k, val := range obj {
			if ps, ok := props[k].(map[string]any); ok {
				v.check(ps, val, path+"."+k)
				continue
			}
			switch ap := schema["additionalProperties"].(type) {
			case bool:
				if !ap {
					v.fail(path, "key %q is not in the schema", k)
				}
			case map[string]any:
				v.check(ap, val, path+"."+k)
			}
		}
	}
	if arr, ok := x.([]any); ok {
		if items, ok := schema["items"].(map[string]any); ok {
			for i, el := range arr {
				v.check(items, el, fmt.Sprintf("%s[%d]", path, i))
			}
		}
	}
}

func loadSchema(t *testing.T) map[string]any {
	t.Helper()
	data, err := os.ReadFile("../docs/report.schema.json")
	require.NoError(t, err)
	var schema map[string]any
	require.NoError(t, json.Unmarshal(data, &schema))
	assert.Equal(t, "https://json-schema.org/draft/2020-12/schema", schema["$schema"])
	return schema
}

func validate(schema map[string]any, doc any) []string {
	v := &schemaValidator{root: schema}
	v.check(schema, doc, "$")
	return v.errs
}

// Every example's real JSON output, and a run without a solution, follow
// the documented schema.
func TestJSONFollowsSchema(t *testing.T) {
	schema := loadSchema(t)
	files, err := filepath.Glob("../examples/*.yaml")
	require.NoError(t, err)
	require.NotEmpty(t, files)
	for _, f := range files {
		net, err := network.Load(f)
		require.NoError(t, err)
		p := net.Steady()
		r := solve.Newton(p, p.InitialGuess(), solve.Settings{})
		require.True(t, r.Reason.Converged(), f)
		sol, run := net.Solution(r.X), Run{Converged: true, Reason: r.Reason.String(), Iterations: r.Iterations}
		for _, s := range []any{sol, nil} {
			var buf bytes.Buffer
			if s == nil {
				require.NoError(t, WriteJSON(&buf, NewReport(sol.Net.Model, nil, Run{Reason: "diverged"})))
			} else {
				require.NoError(t, WriteJSON(&buf, NewReport(sol.Net.Model, sol, run)))
			}
			var doc any
			require.NoError(t, json.Unmarshal(buf.Bytes(), &doc))
			assert.Empty(t, validate(schema, doc), "%s", f)
		}
	}
}

// The validator finds what is wrong: a missing key, a wrong type, a key
// the schema does not know, a value outside an enum.
func TestSchemaValidatorCatchesErrors(t *testing.T) {
	schema := loadSchema(t)
	sol, run := solved(t)
	var buf bytes.Buffer
	require.NoError(t, WriteJSON(&buf, NewReport(sol.Net.Model, sol, run)))
	fresh := func() map[string]any {
		var doc map[string]any
		require.NoError(t, json.Unmarshal(buf.Bytes(), &doc))
		return doc
	}
	doc := fresh()
	delete(doc, "limits_exceeded")
	assert.Contains(t, strings.Join(validate(schema, doc), "\n"), `missing required key "limits_exceeded"`)
	doc = fresh()
	doc["required_margin_K"] = "5 K"
	assert.Contains(t, strings.Join(validate(schema, doc), "\n"), "$.required_margin_K: is string")
	doc = fresh()
	doc["extra"] = 1.0
	assert.Contains(t, strings.Join(validate(schema, doc), "\n"), `key "extra" is not in the schema`)
	doc = fresh()
	doc["nodes"].([]any)[0].(map[string]any)["kind"] = "plasma"
	assert.Contains(t, strings.Join(validate(schema, doc), "\n"), "is not one of")
	assert.NotEmpty(t, validate(map[string]any{"format": "date"}, "x"), "unsupported keywords are reported")
}
