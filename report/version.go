package report

import (
	"time"

	"rockheat/report/expect"
)

// Version returns rockheat's module version and VCS revision from the
// build information (expect.CurrentBuild): ("(devel)", "") for a plain go
// run or go test, and the revision with "+dirty" when the build had
// uncommitted changes.
func Version() (version, revision string) {
	b := expect.CurrentBuild()
	revision = b.Revision
	if b.Modified && revision != "" {
		revision += "+dirty"
	}
	return b.Version, revision
}

// now is the clock of the reproducibility record; tests replace it.
var now = time.Now

// provenance is what a reviewer needs to reproduce a report.
type provenance struct {
	Version, Revision, Date string
	Files                   []fileHash
	Seed                    uint64
	Trials                  int
	Sampling                string
}

// fileHash is a scenario file and its SHA-256.
type fileHash struct{ Name, Path, SHA256 string }

func newProvenance(seed uint64, trials int, sampling string, files []fileHash) provenance {
	v, rev := Version()
	if rev == "" {
		rev = "not recorded (a build without VCS stamping; build with -buildvcs=true to record it)"
	}
	return provenance{Version: v, Revision: rev, Date: now().UTC().Format("2006-01-02 15:04 UTC"),
		Files: files, Seed: seed, Trials: trials, Sampling: sampling}
}

// provenanceHTML is the reproducibility block of the HTML pages.
const provenanceHTML = `{{define "provenance"}}<h2>Reproducibility</h2>
<table class="prov">
<tr><th>rockheat</th><td>{{.Version}}, revision <code>{{.Revision}}</code></td></tr>
<tr><th>run</th><td>{{.Trials}} trials, {{.Sampling}}, seed {{.Seed}}</td></tr>
{{range .Files}}<tr><th>scenario{{if .Name}} {{.Name}}{{end}}</th><td><code>{{.Path}}</code><br>SHA-256 <code class="hash">{{.SHA256}}</code></td></tr>
{{end}}<tr><th>generated</th><td>{{.Date}}</td></tr>
</table>
<p class="note">The same rockheat revision, scenario files and seed give the same figures, bit for bit, on any number of workers.</p>{{end}}`
