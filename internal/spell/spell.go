// Package spell finds the likely intended word behind a misspelling, for
// "did you mean" hints in error messages.
package spell

// Distance returns the edit distance between a and b in runes: insertions,
// deletions, substitutions, and exchanges of two adjacent runes each count
// as one edit (the optimal string alignment distance).
func Distance(a, b string) int {
	ra, rb := []rune(a), []rune(b)
	prev2 := make([]int, len(rb)+1)
	prev := make([]int, len(rb)+1)
	cur := make([]int, len(rb)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(ra); i++ {
		cur[0] = i
		for j := 1; j <= len(rb); j++ {
			cost := 1
			if ra[i-1] == rb[j-1] {
				cost = 0
			}
			cur[j] = min(prev[j]+1, cur[j-1]+1, prev[j-1]+cost)
			if i > 1 && j > 1 && ra[i-1] == rb[j-2] && ra[i-2] == rb[j-1] {
				cur[j] = min(cur[j], prev2[j-2]+1)
			}
		}
		prev2, prev, cur = prev, cur, prev2
	}
	return prev[len(rb)]
}

// Closest returns the candidate nearest to s with a distance of at most
// limit, the first one on ties, or "" when none is that near.
func Closest(s string, candidates []string, limit int) string {
	best, bestDist := "", limit+1
	for _, c := range candidates {
		if d := Distance(s, c); d < bestDist {
			best, bestDist = c, d
		}
	}
	return best
}
