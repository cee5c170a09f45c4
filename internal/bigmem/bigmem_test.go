package bigmem

import (
	"testing"
)

func TestMakeIsMake(t *testing.T) {
	for _, n := range []int{0, 1, 1000, Threshold / 8, 3 * Threshold} {
		s := MakeCap[float64](n/2, n)
		if len(s) != n/2 || cap(s) != n {
			t.Fatalf("MakeCap(%d, %d): len %d cap %d", n/2, n, len(s), cap(s))
		}
		s = s[:n]
		for i, v := range s {
			if v != 0 {
				t.Fatalf("MakeCap(%d): element %d is %g, not zero", n, i, v)
			}
		}
		for i := range s {
			s[i] = float64(i)
		}
		if n > 0 && s[n-1] != float64(n-1) {
			t.Fatalf("write lost")
		}
	}
	b := Make[int32](5)
	if len(b) != 5 || cap(b) != 5 {
		t.Fatalf("Make(5): len %d cap %d", len(b), cap(b))
	}
}
