package validity

import "testing"

func TestRangeCheck(t *testing.T) {
	re := Range{Name: "Re", Min: 3000, Max: 5e6}
	if got := re.Check(1e4); got != "" {
		t.Errorf("inside: got %q", got)
	}
	if got, want := re.Check(1200), "Re = 1200 is outside 3000 to 5e+06"; got != want {
		t.Errorf("outside: got %q, want %q", got, want)
	}
	open := Range{Name: "L/Dh", Min: 10}
	if got, want := open.Check(2), "L/Dh = 2 is below 10"; got != want {
		t.Errorf("open range: got %q, want %q", got, want)
	}
	if !open.Contains(1e9) {
		t.Error("open range should have no upper bound")
	}
}
