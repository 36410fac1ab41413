package report

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"regexp"
	"strings"
	"testing"

	"rockheat"
	"rockheat/scenarios"
)

func runExample(t *testing.T, name string, trials int) *rockheat.Result {
	t.Helper()
	ex, err := scenarios.LookupExample(name)
	if err != nil {
		t.Fatal(err)
	}
	s, err := scenarios.Parse(name, ex.Text)
	if err != nil {
		t.Fatal(err)
	}
	r, err := rockheat.Estimate(&s.Run, rockheat.Options{Trials: trials})
	if err != nil {
		t.Fatal(err)
	}
	return r
}

// TestJSONContract checks the keys and units of the JSON contract that CI
// pipelines parse, and that P90 ≤ P50 ≤ P10 (exceedance convention).
func TestJSONContract(t *testing.T) {
	t.Parallel()
	r := runExample(t, "demo", 3000)
	var buf bytes.Buffer
	if err := JSON(&buf, r); err != nil {
		t.Fatal(err)
	}
	var doc struct {
		Title          string
		Kind           string
		Trials         int
		Seed           uint64
		Sampling       string
		ZeroHeatTrials *int `json:"zero_heat_trials"`
		Caution        string
		Outputs        map[string]struct {
			Unit                              string
			P90, P50, P10, Mean, SD, Min, Max float64
		}
		Sensitivity map[string][]struct {
			Input           string
			RankCorrelation float64 `json:"rank_correlation"`
			VarianceShare   float64 `json:"variance_share"`
			SwingLow        float64 `json:"swing_low"`
			SwingHigh       float64 `json:"swing_high"`
		}
	}
	if err := json.Unmarshal(buf.Bytes(), &doc); err != nil {
		t.Fatal(err)
	}
	if doc.Kind != "reservoir" || doc.Trials != 3000 || doc.Seed != 12345 || doc.Sampling != "lhs" || doc.ZeroHeatTrials == nil {
		t.Errorf("header = %+v", doc)
	}
	units := map[string]string{"heat_in_place": "J", "recoverable_heat": "J", "thermal_power": "MWth", "electric_power": "MWe"}
	for name, unit := range units {
		o, ok := doc.Outputs[name]
		if !ok {
			t.Errorf("no output %s", name)
			continue
		}
		if o.Unit != unit {
			t.Errorf("%s unit %q, want %q", name, o.Unit, unit)
		}
		if !(o.Min <= o.P90 && o.P90 <= o.P50 && o.P50 <= o.P10 && o.P10 <= o.Max) {
			t.Errorf("%s out of order: %+v", name, o)
		}
		if len(doc.Sensitivity[name]) == 0 {
			t.Errorf("no sensitivity for %s", name)
		}
	}
	if !strings.Contains(doc.Caution, "not a reserves") || !strings.Contains(doc.Caution, "competent or qualified person") {
		t.Errorf("caution %q", doc.Caution)
	}
	// Output keys come in model order.
	s := buf.String()
	if !(strings.Index(s, `"heat_in_place"`) < strings.Index(s, `"recoverable_heat"`) &&
		strings.Index(s, `"recoverable_heat"`) < strings.Index(s, `"thermal_power"`) &&
		strings.Index(s, `"thermal_power"`) < strings.Index(s, `"electric_power"`)) {
		t.Error("outputs not in model order")
	}
}

func TestJSONHotRockGroup(t *testing.T) {
	t.Parallel()
	r := runExample(t, "hot-rock-demo", 2000)
	var buf bytes.Buffer
	if err := JSON(&buf, r); err != nil {
		t.Fatal(err)
	}
	var doc struct {
		Outputs struct {
			TimeConstant   struct{ Unit string } `json:"time_constant"`
			ThermalPowerAt []struct {
				Year          float64
				Unit          string
				P90, P50, P10 float64
			} `json:"thermal_power_at"`
		}
	}
	if err := json.Unmarshal(buf.Bytes(), &doc); err != nil {
		t.Fatal(err)
	}
	if doc.Outputs.TimeConstant.Unit != "years" {
		t.Errorf("time_constant unit %q", doc.Outputs.TimeConstant.Unit)
	}
	at := doc.Outputs.ThermalPowerAt
	if len(at) != 4 || at[0].Year != 0 || at[3].Year != 30 || at[0].Unit != "MWth" {
		t.Fatalf("thermal_power_at = %+v", at)
	}
	// The exponential decline: each year's P50 below the one before.
	for i := 1; i < len(at); i++ {
		if !(at[i].P50 < at[i-1].P50) {
			t.Errorf("P50 at year %g (%g) not below year %g (%g)", at[i].Year, at[i].P50, at[i-1].Year, at[i-1].P50)
		}
	}
}

func TestTextReport(t *testing.T) {
	t.Parallel()
	r := runExample(t, "demo", 2000)
	var buf bytes.Buffer
	if err := Text(&buf, r); err != nil {
		t.Fatal(err)
	}
	out := buf.String()
	for _, want := range []string{r.Title, "P90 (low)", "P50 (best)", "P10 (high)", "EJ", "MWe", "exceeded by 90% of trials",
		"Muffler & Cataldi", "What drives electric capacity", "CAUTION", "not a reserves", "competent or qualified person", "licensed practice"} {
		if !strings.Contains(out, want) {
			t.Errorf("text report lacks %q", want)
		}
	}
}

func TestCSV(t *testing.T) {
	t.Parallel()
	r := runExample(t, "demo", 1000)
	var buf bytes.Buffer
	if err := CSV(&buf, r); err != nil {
		t.Fatal(err)
	}
	rows, err := csv.NewReader(&buf).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if len(rows) != 1+len(r.Outputs) || rows[0][0] != "output" || rows[1][0] != "heat_in_place" || rows[1][1] != "J" {
		t.Errorf("rows = %v", rows)
	}
}

// TestMethodNamesThePressure: an IF97 reservoir run says where its fluid
// pressure comes from, the reservoir's middle when it is left to the
// geotherm, and nothing of a middle when a depth is given.
func TestMethodNamesThePressure(t *testing.T) {
	t.Parallel()
	const middle = "hydrostatic at each trial's reservoir middle"
	ex, err := scenarios.LookupExample("depth-gradient")
	if err != nil {
		t.Fatal(err)
	}
	src := strings.Replace(string(ex.Text), "[model]", "[model]\nfluid = \"if97\"", 1)
	src = regexp.MustCompile(`(?m)^fluid_(density|heat_capacity)_.*\n`).ReplaceAllString(src, "")
	for _, c := range []struct {
		extra string
		want  bool
	}{{"", true}, {"\ndepth_m = 3000", false}} {
		s, err := scenarios.Parse("depth-gradient, if97", []byte(strings.Replace(src, "[inputs]", "[inputs]"+c.extra, 1)))
		if err != nil {
			t.Fatal(err)
		}
		r, err := rockheat.Estimate(&s.Run, rockheat.Options{Trials: 500})
		if err != nil {
			t.Fatal(err)
		}
		if got := strings.Contains(methodText(r), middle); got != c.want {
			t.Errorf("depth %q: method text %q; mentions the middle %v, want %v", c.extra, methodText(r), got, c.want)
		}
	}
}
