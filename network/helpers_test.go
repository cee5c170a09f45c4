package network_test

import (
	"errors"
	"os"
	"testing"

	"github.com/heatgraph/heatgraph/network"
)

func readFile(t *testing.T, path string) string {
	t.Helper()
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	return string(b)
}

func parseOK(t *testing.T, text string) *network.Model {
	t.Helper()
	m, err := network.Parse("m.yaml", []byte(text))
	if err != nil {
		t.Fatalf("parse: %v", err)
	}
	return m
}

func problems(t *testing.T, text string) network.Problems {
	t.Helper()
	_, err := network.Parse("m.yaml", []byte(text))
	var ps network.Problems
	if !errors.As(err, &ps) {
		t.Fatalf("got %v, want a list of problems", err)
	}
	return ps
}
