package expect

import (
	"bytes"
	"regexp"
	"strings"
	"testing"
)

// validText returns a written expectation of the calibration scenario.
func validText(t testing.TB) string {
	t.Helper()
	e, err := record(parse(t, calibrationScenario), 5)
	if err != nil {
		t.Fatal(err)
	}
	var b bytes.Buffer
	if err := Write(&b, e); err != nil {
		t.Fatal(err)
	}
	return b.String()
}

// TestReadProblems edits a valid expectation one way at a time: each edit
// gives an error naming what is wrong.
func TestReadProblems(t *testing.T) {
	t.Parallel()
	if _, err := Read(strings.NewReader(fuzzSeed)); err != nil {
		t.Errorf("the fuzz seed is not a valid expectation: %v", err)
	}
	good := validText(t)
	p50 := between(good, `"p50": "`, `"`)
	cases := []struct {
		name, text string
		want       []string
	}{
		{"empty", "", []string{"empty file"}},
		{"truncated", good[:len(good)/2], []string{"ends early", "truncated"}},
		{"not JSON", "title = \"x\"\n", []string{"line 1", "JSON syntax"}},
		{"figure not a number", strings.Replace(good, `"p50": "`+p50+`"`, `"p50": "abc"`, 1), []string{"output heat_in_place: p50", `"abc" is not a number`}},
		{"figure as a JSON number", strings.Replace(good, `"p50": "`+p50+`"`, `"p50": 12`, 1), []string{"line", "p50", "JSON string"}},
		{"figure missing", strings.Replace(good, `"p50": "`+p50+`",`, ``, 1), []string{"output heat_in_place: p50: missing"}},
		{"unknown key", strings.Replace(good, `"title"`, `"titel"`, 1), []string{`unknown key "titel"`}},
		{"other format", strings.Replace(good, Format, "rockheat-expectation/0", 1), []string{"format", "rockheat-expectation/0"}},
		{"bad hash", strings.Replace(good, `"scenario_sha256": "`, `"scenario_sha256": "zz`, 1), []string{"scenario_sha256", "hex"}},
		{"no trials", strings.Replace(good, `"trials": 1000`, `"trials": 0`, 1), []string{"trials 0"}},
		{"bad sampling", strings.Replace(good, `"sampling": "random"`, `"sampling": "sobol"`, 1), []string{`sampling "sobol"`}},
		{"bad confidence", strings.Replace(good, `"confidence": 0.95`, `"confidence": 95`, 1), []string{"confidence 95"}},
		{"zero-heat above trials", replaceKey(good, "zero_heat_trials", "5000"), []string{"zero_heat_trials 5000"}},
		{"no outputs", good[:strings.Index(good, `"outputs"`)] + `"outputs": []}`, []string{"no outputs"}},
		{"short interval", regexp.MustCompile(`"p90_ci": \[[^]]*\]`).ReplaceAllString(good, `"p90_ci": ["1"]`), []string{"pair", "not 1"}},
		{"long interval", regexp.MustCompile(`"p90_ci": \[[^]]*\]`).ReplaceAllString(good, `"p90_ci": ["1", "2", "3"]`), []string{"pair", "not 3"}},
		{"trials as text", strings.Replace(good, `"trials": 1000`, `"trials": "1000"`, 1), []string{"line", "trials", "a whole number"}},
		{"repeated output", strings.Replace(good, `"name": "recoverable_heat"`, `"name": "heat_in_place"`, 1), []string{"repeated"}},
		{"trailing text", good + "{}", []string{"more text"}},
		{"negative seed", strings.Replace(good, `"seed": 5`, `"seed": -5`, 1), []string{"seed", "a whole number ≥ 0"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			_, err := Read(strings.NewReader(c.text))
			if err == nil {
				t.Fatal("no error")
			}
			for _, w := range c.want {
				if !strings.Contains(err.Error(), w) {
					t.Errorf("error %q lacks %q", err, w)
				}
			}
		})
	}
}

// TestReadTruncatedAnywhere: a file cut at any byte is an error, never a
// panic or a silently shorter record.
func TestReadTruncatedAnywhere(t *testing.T) {
	t.Parallel()
	good := validText(t)
	for n := 0; n < len(strings.TrimSpace(good)); n += 7 {
		if _, err := Read(strings.NewReader(good[:n])); err == nil {
			t.Fatalf("cut at byte %d of %d: no error", n, len(good))
		}
	}
}

// FuzzRead: Read never panics, and what it accepts writes back and reads
// again to the same record.
func FuzzRead(f *testing.F) {
	f.Add(fuzzSeed)
	f.Add(`{"format": "` + Format + `"}`)
	f.Fuzz(func(t *testing.T, text string) {
		e, err := Read(strings.NewReader(text))
		if err != nil {
			return
		}
		var b bytes.Buffer
		if err := Write(&b, e); err != nil {
			t.Fatal(err)
		}
		back, err := Read(&b)
		if err != nil || !back.SameRecord(e) {
			t.Fatalf("accepted record does not read back: %v", err)
		}
	})
}

// between returns the text of s between the first before and the next after.
func between(s, before, after string) string {
	i := strings.Index(s, before) + len(before)
	return s[i : i+strings.Index(s[i:], after)]
}

// replaceKey sets the value of the first key in s to value.
func replaceKey(s, key, value string) string {
	old := between(s, `"`+key+`": `, ",")
	return strings.Replace(s, `"`+key+`": `+old+",", `"`+key+`": `+value+",", 1)
}

// fuzzSeed is a small valid expectation.
var fuzzSeed = `{"format": "rockheat-expectation/1", "scenario_sha256": "` + strings.Repeat("ab", 32) + `", "trials": 10, "sampling": "lhs", "confidence": 0.95, "percentiles": "exact", "outputs": [{"name": "heat_in_place", "p90": "1", "p50": "2", "p10": "3", "mean": "2", "sd": "1", "min": "0", "max": "4", "p90_ci": ["0", "2"], "p50_ci": ["1", "3"], "p10_ci": ["2", "4"], "mean_ci": ["1", "3"]}]}`
