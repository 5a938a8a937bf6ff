package sweep

import (
	"fmt"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"
)

// TestSchedulerExamples: the Slurm job-array script and the Kubernetes
// Indexed Job manifest pass --shard in the form the command accepts, with
// as many shards as array tasks or completions (0-based indices: Slurm
// --array=0-3, JOB_COMPLETION_INDEX 0 … completions − 1), every index
// gives a valid shard, and the family they name is a valid example.
func TestSchedulerExamples(t *testing.T) {
	for _, c := range []struct {
		file, indexVar string
		count          *regexp.Regexp // submatch: the number of tasks (or the last index)
		lastIndex      bool
	}{
		{"sweep-slurm.sh", "SLURM_ARRAY_TASK_ID", regexp.MustCompile(`(?m)^#SBATCH --array=0-([0-9]+)$`), true},
		{"sweep-indexed-job.yaml", "JOB_COMPLETION_INDEX", regexp.MustCompile(`(?m)^  completions: ([0-9]+)$`), false},
	} {
		text := string(readExample(t, c.file))
		m := c.count.FindStringSubmatch(text)
		if m == nil {
			t.Errorf("%s: no task count", c.file)
			continue
		}
		tasks, _ := strconv.Atoi(m[1])
		if c.lastIndex {
			tasks++
		}
		shard := regexp.MustCompile(`--shard "\$`+c.indexVar+`/([0-9]+)"`).FindAllStringSubmatch(text, -1)
		if len(shard) != 1 {
			t.Errorf("%s: %d --shard \"$%s/n\" arguments, want 1", c.file, len(shard), c.indexVar)
			continue
		}
		if n, _ := strconv.Atoi(shard[0][1]); n != tasks {
			t.Errorf("%s: --shard .../%d with %d tasks", c.file, n, tasks)
		}
		for i := 0; i < tasks; i++ {
			if _, err := ParseShard(fmt.Sprintf("%d/%s", i, shard[0][1])); err != nil {
				t.Errorf("%s: task %d: %v", c.file, i, err)
			}
		}
		if _, err := ParseShard(fmt.Sprintf("%d/%s", tasks, shard[0][1])); err == nil {
			t.Errorf("%s: index %d accepted for %d shards", c.file, tasks, tasks)
		}
		if strings.Contains(c.file, "slurm") && !strings.Contains(text, "#SBATCH --array=0-3") {
			t.Errorf("%s: not a four-task array", c.file)
		}
		if strings.Contains(c.file, "yaml") && !strings.Contains(text, "completionMode: Indexed") {
			t.Errorf("%s: not an Indexed Job", c.file)
		}
		for i := 0; i < tasks; i++ {
			if dir := fmt.Sprintf("shard-%d ", i); !strings.Contains(text, "gapcert merge") || !strings.Contains(text, dir) && !strings.Contains(text, fmt.Sprintf("shard-%d --out", i)) {
				t.Errorf("%s: the merge step does not name shard-%d", c.file, i)
			}
		}
		fam := regexp.MustCompile(`[a-z_/]*triangle_apex_family\.json`).FindString(text)
		if _, err := ParseFamily(readExample(t, filepath.Base(fam))); err != nil {
			t.Errorf("%s: family %s: %v", c.file, fam, err)
		}
	}
	if st, err := os.Stat(filepath.Join(examples, "sweep-slurm.sh")); err != nil || st.Mode()&0o111 == 0 {
		t.Errorf("sweep-slurm.sh is not executable (%v)", err)
	}
}

// TestParseShard: valid shards, and the errors for the rest.
func TestParseShard(t *testing.T) {
	for _, c := range []struct {
		text string
		want Shard
	}{{"0/1", Shard{0, 1}}, {"3/4", Shard{3, 4}}, {"0/4", Shard{0, 4}}, {"12/100", Shard{12, 100}}} {
		got, err := ParseShard(c.text)
		if err != nil || got != c.want {
			t.Errorf("%q: %v, %v", c.text, got, err)
		}
	}
	for _, c := range []struct{ text, want string }{
		{"5/4", "shard index 5 is not below the number of shards 4"},
		{"4/4", "indices are 0-based"},
		{"0/0", "at least 1"},
		{"two/four", "non-negative decimal integers"},
		{"-1/4", "non-negative decimal integers"},
		{"1/4x", "non-negative decimal integers"},
		{" 1/4", "non-negative decimal integers"},
		{"1", "not of the form i/n"},
		{"", "not of the form i/n"},
		{"1/2/3", "non-negative decimal integers"},
	} {
		_, err := ParseShard(c.text)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%q: error %v, want %q", c.text, err, c.want)
		}
	}
}

// TestShardsPartition: the shards of n are disjoint and cover 0 … N−1.
func TestShardsPartition(t *testing.T) {
	for _, n := range []int{1, 2, 3, 4, 7} {
		for k := 0; k < 50; k++ {
			owners := 0
			for i := 0; i < n; i++ {
				if (Shard{i, n}).Contains(k) {
					owners++
				}
			}
			if owners != 1 {
				t.Errorf("point %d belongs to %d of %d shards", k, owners, n)
			}
		}
	}
}
