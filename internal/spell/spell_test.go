package spell

import "testing"

func TestDistance(t *testing.T) {
	// Levenshtein's textbook cases; the exchange of neighbours counts once
	// (Damerau 1964).
	tests := []struct {
		a, b string
		want int
	}{
		{"", "", 0},
		{"mm", "", 2},
		{"kitten", "sitting", 3},
		{"flaw", "lawn", 2},
		{"°C", "ºC", 1},
		{"thicknes", "thickness", 1},
		{"conductoin", "conduction", 1},
		{"ab", "ba", 1},
	}
	for _, tt := range tests {
		if d1, d2 := Distance(tt.a, tt.b), Distance(tt.b, tt.a); d1 != tt.want || d2 != tt.want {
			t.Errorf("Distance(%q, %q) = %d, %d the other way; want %d", tt.a, tt.b, d1, d2, tt.want)
		}
	}
}

func TestClosest(t *testing.T) {
	words := []string{"thickness", "length", "area"}
	if got := Closest("lenght", words, 2); got != "length" {
		t.Errorf("got %q", got)
	}
	if got := Closest("volume", words, 2); got != "" {
		t.Errorf("got %q, want none", got)
	}
}
