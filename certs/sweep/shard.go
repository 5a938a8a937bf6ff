package sweep

import (
	"fmt"
	"strconv"
	"strings"
)

// maxShards bounds the number of shards of a run.
const maxShards = MaxPoints

// ParseShard reads a shard as "i/n": part i of n, with 0 ≤ i < n
// (0-based, as Slurm job-array and Kubernetes Indexed Job indices are),
// both plain decimal integers. Errors are *InvalidError.
func ParseShard(s string) (Shard, error) {
	const hint = `write --shard i/n with 0 ≤ i < n, for example 0/4 … 3/4`
	is, ns, ok := strings.Cut(s, "/")
	if !ok {
		return Shard{}, invalid("--shard", fmt.Sprintf("%q is not of the form i/n", s), hint)
	}
	i, errI := plainInt(is)
	n, errN := plainInt(ns)
	switch {
	case errI != nil || errN != nil:
		return Shard{}, invalid("--shard", fmt.Sprintf("%q: i and n must be non-negative decimal integers", s), hint)
	case n < 1:
		return Shard{}, invalid("--shard", fmt.Sprintf("%q: the number of shards must be at least 1", s), hint)
	case n > maxShards:
		return Shard{}, invalid("--shard", fmt.Sprintf("%q: at most %d shards", s, maxShards), hint)
	case i >= n:
		return Shard{}, invalid("--shard", fmt.Sprintf("%q: shard index %d is not below the number of shards %d (indices are 0-based)", s, i, n), hint)
	}
	return Shard{Index: i, Count: n}, nil
}

// plainInt parses 1 to 6 ASCII digits.
func plainInt(s string) (int, error) {
	if s == "" || len(s) > 6 {
		return 0, strconv.ErrSyntax
	}
	for i := 0; i < len(s); i++ {
		if s[i] < '0' || s[i] > '9' {
			return 0, strconv.ErrSyntax
		}
	}
	return strconv.Atoi(s)
}

// String returns "i/n".
func (s Shard) String() string { return fmt.Sprintf("%d/%d", s.Index, s.Count) }

// Contains reports whether point k belongs to the shard (k mod Count =
// Index). The shards 0/n … (n−1)/n are disjoint and cover every point.
func (s Shard) Contains(k int) bool { return k%s.Count == s.Index }

// whole is the shard of an unsharded run.
var whole = Shard{Index: 0, Count: 1}
