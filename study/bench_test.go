package study

import (
	"testing"
)

// go test -run x -bench . ./study/
func BenchmarkSensitivity(b *testing.B) {
	m, err := Open("../examples/outdoor-controller.yaml", nil)
	if err != nil {
		b.Fatal(err)
	}
	for b.Loop() {
		if _, err := m.Sensitivity(); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkSweep(b *testing.B) {
	st, err := ReadStudy("../examples/studies/ambient-sweep.yaml", nil)
	if err != nil {
		b.Fatal(err)
	}
	nodes, _, err := st.Model.Nodes()
	if err != nil {
		b.Fatal(err)
	}
	for b.Loop() {
		st.Model.Run(st.Grid, All(st.Grid.Len()), IDs(nodes), nil)
	}
}
