package network_test

import (
	"strings"
	"testing"
)

// The annotated model in README.md must stay valid and solvable.
func TestReadmeModel(t *testing.T) {
	readme := readFile(t, "../README.md")
	start := strings.Index(readme, "```yaml\n")
	if start < 0 {
		t.Fatal("README.md has no yaml block")
	}
	body := readme[start+len("```yaml\n"):]
	body = body[:strings.Index(body, "```")]
	sol := solveModel(t, "README.md", body)
	if len(sol.Nodes) != 5 || len(sol.Links) != 7 {
		t.Errorf("README model: %d nodes, %d links; want 5 and 7", len(sol.Nodes), len(sol.Links))
	}
}
