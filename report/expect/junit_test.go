package expect

import (
	"bytes"
	"encoding/xml"
	"strings"
	"testing"
)

// TestWriteJUnit writes one passing, one failing and one erroring case and
// reads the XML back with encoding/xml.
func TestWriteJUnit(t *testing.T) {
	t.Parallel()
	var b bytes.Buffer
	var table bytes.Buffer
	if err := WriteDrifts(&table, []Row{{Scenario: "a.toml", Check: Check{Figure: "heat_in_place.p50", Expected: "1", Got: "2", Limit: 0.5}}}); err != nil {
		t.Fatal(err)
	}
	cases := []Case{
		{Name: "lib/ok.toml", Seconds: 0.25},
		{Name: "lib/a.toml", Seconds: 0.5, Failure: "results drifted: 1 figure", Detail: table.String()},
		{Name: "lib/bad <x>.toml", Error: "no expectation beside it & no run", Detail: "write one with --update"},
	}
	if err := WriteJUnit(&b, "rockheat regress", cases); err != nil {
		t.Fatal(err)
	}
	if !strings.HasPrefix(b.String(), xml.Header) {
		t.Errorf("no XML header:\n%s", b.String())
	}
	var doc struct {
		Tests    int `xml:"tests,attr"`
		Failures int `xml:"failures,attr"`
		Errors   int `xml:"errors,attr"`
		Suite    struct {
			Name  string `xml:"name,attr"`
			Cases []struct {
				Name    string `xml:"name,attr"`
				Time    string `xml:"time,attr"`
				Failure *struct {
					Message string `xml:"message,attr"`
					Text    string `xml:",chardata"`
				} `xml:"failure"`
				Error *struct {
					Message string `xml:"message,attr"`
				} `xml:"error"`
			} `xml:"testcase"`
		} `xml:"testsuite"`
	}
	if err := xml.Unmarshal(b.Bytes(), &doc); err != nil {
		t.Fatalf("%v\n%s", err, b.String())
	}
	cs := doc.Suite.Cases
	switch {
	case doc.Tests != 3 || doc.Failures != 1 || doc.Errors != 1 || len(cs) != 3:
		t.Errorf("tests %d failures %d errors %d cases %d", doc.Tests, doc.Failures, doc.Errors, len(cs))
	case cs[0].Failure != nil || cs[0].Error != nil || cs[0].Time != "0.250":
		t.Errorf("passing case = %+v", cs[0])
	case cs[1].Failure == nil || !strings.Contains(cs[1].Failure.Text, "heat_in_place.p50") || !strings.Contains(cs[1].Failure.Text, "±0.5"):
		t.Errorf("failing case = %+v", cs[1])
	case cs[2].Name != "lib/bad <x>.toml" || cs[2].Error == nil || cs[2].Error.Message != "no expectation beside it & no run":
		t.Errorf("erroring case = %+v", cs[2])
	}
}
