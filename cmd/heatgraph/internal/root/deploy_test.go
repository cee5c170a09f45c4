package root

import (
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/exit"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"gopkg.in/yaml.v3"
)

const deploy = "../../../../deploy/"

// The cluster examples run the command lines they show: the Indexed Job's
// and the job array's, with their variables set as the cluster sets them
// for every index, give shards that merge into the whole study.
func TestClusterExamplesRun(t *testing.T) {
	data, err := os.ReadFile(deploy + "kubernetes/montecarlo-job.yaml")
	require.NoError(t, err)
	var job struct {
		Spec struct {
			CompletionMode string `yaml:"completionMode"`
			Completions    int    `yaml:"completions"`
			Template       struct {
				Spec struct {
					Containers []struct {
						Env  []struct{ Name, Value string }
						Args []string
					}
				}
			}
		}
	}
	require.NoError(t, yaml.Unmarshal(data, &job))
	assert.Equal(t, "Indexed", job.Spec.CompletionMode)
	c := job.Spec.Template.Spec.Containers[0]
	require.Equal(t, "SHARDS", c.Env[0].Name)
	assert.Equal(t, itoa(job.Spec.Completions), c.Env[0].Value)
	script, err := os.ReadFile(deploy + "slurm/montecarlo.sbatch")
	require.NoError(t, err)
	// The command: from "heatgraph montecarlo" to the first line that does
	// not end in a backslash.
	at := strings.Index(string(script), "\nheatgraph montecarlo ")
	require.GreaterOrEqual(t, at, 0)
	var slurm []string
	for _, l := range strings.Split(string(script)[at+1:], "\n") {
		slurm = append(slurm, strings.TrimSuffix(l, "\\"))
		if !strings.HasSuffix(l, "\\") {
			break
		}
	}

	dir := t.TempDir()
	model, err := filepath.Abs(examples + "bench-logger.yaml")
	require.NoError(t, err)
	study := filepath.Join(dir, "study.yaml")
	require.NoError(t, os.WriteFile(study, []byte("model: "+model+`
montecarlo:
  samples: 12
  seed: 5
  vary:
    - {vary: ambient.temperature, uniform: {low: 20 degC, high: 40 degC}}
`), 0o644))
	code, _, stderr := run("montecarlo", study, "-o", dir+"/whole.csv")
	require.Equal(t, exit.OK, code, stderr)
	whole, err := os.ReadFile(dir + "/whole.csv")
	require.NoError(t, err)
	for name, cmd := range map[string]string{"kubernetes": c.Args[0], "slurm": strings.Join(slurm, " ")} {
		n := 3
		var parts []string
		for i := range n {
			env := map[string]string{"JOB_COMPLETION_INDEX": itoa(i), "SHARDS": itoa(n), "SLURM_ARRAY_TASK_ID": itoa(i),
				"SLURM_ARRAY_TASK_COUNT": itoa(n), "study": study}
			args := shellWords(t, cmd, env)
			require.Equal(t, "heatgraph", args[0])
			for k, a := range args {
				if strings.HasPrefix(a, "/results/") || strings.HasPrefix(a, "results/") {
					args[k] = filepath.Join(dir, filepath.Base(a))
					parts = append(parts, args[k])
				}
				if a == "/study/study.yaml" {
					args[k] = study
				}
			}
			code, _, stderr := run(args[1:]...)
			require.Equal(t, exit.OK, code, "%s: %s", name, stderr)
		}
		code, merged, stderr := run(append([]string{"merge", "--points", "12"}, parts...)...)
		require.Equal(t, exit.OK, code, stderr)
		assert.Equal(t, string(whole), merged, name)
	}
}

// shellWords splits a command line as /bin/sh would for these simple
// lines: words, double quotes, $VAR and ${VAR}.
func shellWords(t *testing.T, line string, env map[string]string) []string {
	t.Helper()
	line = regexp.MustCompile(`\$\{?([A-Za-z_][A-Za-z0-9_]*)\}?`).ReplaceAllStringFunc(line, func(v string) string {
		name := strings.Trim(v, "${}")
		val, ok := env[name]
		require.True(t, ok, "unset variable %s", name)
		return val
	})
	var out []string
	for _, w := range regexp.MustCompile(`"[^"]*"|\S+`).FindAllString(line, -1) {
		out = append(out, strings.ReplaceAll(w, `"`, ""))
	}
	return out
}

func itoa(i int) string { return strconv.Itoa(i) }
