package expect

import (
	"bytes"
	"math"
	"reflect"
	"strconv"
	"testing"
)

// TestNumberRoundTrip: the shortest decimal of strconv's 'g', -1 format
// reads back as the same float64, bit for bit (IEEE 754 binary64,
// including the smallest subnormal and the largest finite value).
func TestNumberRoundTrip(t *testing.T) {
	t.Parallel()
	for _, x := range []float64{0, math.Copysign(0, -1), 0.1, 1.0 / 3, 7.261881246613571e18, 1e21, 5e-324,
		math.MaxFloat64, -2.5, math.Inf(1), math.Inf(-1)} {
		got, err := Num(x).Float()
		if err != nil || math.Float64bits(got) != math.Float64bits(x) {
			t.Errorf("Num(%v) = %q reads back as %v (%v)", x, Num(x), got, err)
		}
	}
	if got, err := Num(math.NaN()).Float(); err != nil || !math.IsNaN(got) {
		t.Errorf("NaN reads back as %v (%v)", got, err)
	}
	for _, bad := range []Number{"", "abc", "1,5", "0x"} {
		if _, err := bad.Float(); err == nil {
			t.Errorf("Number(%q).Float() gave no error", string(bad))
		}
	}
}

// TestHash: SHA-256 of "abc" (FIPS 180-2, appendix B.1).
func TestHash(t *testing.T) {
	t.Parallel()
	if got := Hash([]byte("abc")); got != "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad" {
		t.Errorf("Hash(abc) = %s", got)
	}
}

func TestPath(t *testing.T) {
	t.Parallel()
	for _, c := range []struct{ in, want string }{
		{"demo.toml", "demo.expect.json"},
		{"lib/x/hot.rock.toml", "lib/x/hot.rock.expect.json"},
		{"noext", "noext.expect.json"},
	} {
		if got := Path(c.in); got != c.want {
			t.Errorf("Path(%q) = %q, want %q", c.in, got, c.want)
		}
	}
}

// TestNewRecordsEveryFigure: each recorded figure is the shortest decimal
// of the run's own figure, and an expectation reads back as written.
func TestNewRecordsEveryFigure(t *testing.T) {
	t.Parallel()
	s := parse(t, calibrationScenario)
	seed := uint64(3)
	res, err := runScenario(s, seed)
	if err != nil {
		t.Fatal(err)
	}
	e := New(res, "calibration.toml", s.Source, CurrentBuild())
	if e.Trials != 1000 || e.Seed != 3 || e.Sampling != "random" || e.Percentiles != "exact" || e.ScenarioSHA256 != Hash(s.Source) {
		t.Errorf("settings = %d %d %s %s %s", e.Trials, e.Seed, e.Sampling, e.Percentiles, e.ScenarioSHA256)
	}
	if len(e.Outputs) != len(res.Outputs) || e.ZeroHeatTrials != res.ZeroHeatTrials || res.ZeroHeatTrials == 0 {
		t.Fatalf("%d outputs, %d zero-heat trials; run has %d, %d", len(e.Outputs), e.ZeroHeatTrials, len(res.Outputs), res.ZeroHeatTrials)
	}
	for i, o := range res.Outputs {
		r := e.Outputs[i]
		sm := o.Summary
		for _, c := range []struct {
			got  Number
			want float64
		}{{r.P90, sm.P90}, {r.P50, sm.P50}, {r.P10, sm.P10}, {r.Mean, sm.Mean}, {r.SD, sm.SD}, {r.Min, sm.Min},
			{r.Max, sm.Max}, {r.P50CI[0], sm.P50CI.Lo}, {r.P10CI[1], sm.P10CI.Hi}, {r.MeanCI[1], sm.MeanCI.Hi}} {
			if string(c.got) != strconv.FormatFloat(c.want, 'g', -1, 64) {
				t.Errorf("%s: recorded %s, run %v", o.Spec.Name, c.got, c.want)
			}
		}
	}
	if n := len(e.Figures()); n != 15*len(e.Outputs)+1 {
		t.Errorf("%d figures, want 15 per output and the zero-heat count", n)
	}
	var b bytes.Buffer
	if err := Write(&b, e); err != nil {
		t.Fatal(err)
	}
	back, err := Read(&b)
	if err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(back, e) || !back.SameRecord(e) {
		t.Errorf("read back differs:\n%+v\n%+v", back, e)
	}
	other := *back
	other.WrittenBy.Version = "v9.9.9"
	if !other.SameRecord(e) {
		t.Error("SameRecord depends on who wrote the record")
	}
	other.Outputs = append([]Output(nil), back.Outputs...)
	other.Outputs[0].P50 = "1"
	if other.SameRecord(e) {
		t.Error("SameRecord ignores a changed figure")
	}
	if ms := Moves(e, &other); len(ms) != 1 || ms[0].Figure != "heat_in_place.p50" || ms[0].New != "1" {
		t.Errorf("Moves = %+v, want heat_in_place.p50 only", ms)
	}
}

func TestBuildInfoString(t *testing.T) {
	t.Parallel()
	b := BuildInfo{Module: "rockheat", Version: "(devel)", Revision: "7d1c3552b8728320627afe340a7f545c60f969cd", Modified: true, Go: "go1.26.8", Platform: "linux/amd64"}
	if got, want := b.String(), "rockheat (devel) rev 7d1c3552b872 (modified), go1.26.8 linux/amd64"; got != want {
		t.Errorf("String() = %q, want %q", got, want)
	}
	if c := CurrentBuild(); c.Module == "" || c.Version == "" || c.Go == "" {
		t.Errorf("CurrentBuild() = %+v, want module, version and Go set", c)
	}
}
