package claim

// EditDistance is the Levenshtein distance between a and b in bytes (names
// longer than 64 bytes count as far from everything). It chooses the
// nearest known name for a hint ("did you mean"); nothing is decided by it.
func EditDistance(a, b string) int {
	if len(a) > 64 || len(b) > 64 {
		return 1 << 30
	}
	prev := make([]int, len(b)+1)
	cur := make([]int, len(b)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(a); i++ {
		cur[0] = i
		for j := 1; j <= len(b); j++ {
			c := prev[j-1]
			if a[i-1] != b[j-1] {
				c++
			}
			cur[j] = min(c, prev[j]+1, cur[j-1]+1)
		}
		prev, cur = cur, prev
	}
	return prev[len(b)]
}
