package rockheat

import (
	"errors"
	"fmt"
	"math"
	"strings"
	"unicode"
	"unicode/utf8"

	"gonum.org/v1/gonum/mat"

	"rockheat/sampler"
)

// InputError is one problem with a Run: with one of its inputs, or with
// one of its settings.
type InputError struct {
	// Input is the name of the input at fault, in the unit given (e.g.
	// "area_km2"); empty when the problem is with a setting.
	Input string
	// Setting names the setting at fault when Input is empty: "title",
	// "model", "trials", "correlations", "layers" or "report_years" (and,
	// in a portfolio, "prospects", "shared" or "target_mwe"); Index is the
	// 1-based entry of a list setting (a correlation, a layer), or 0.
	Setting string
	Index   int
	// Missing is true for an input that must be given and is not.
	Missing bool
	// Unknown is a name the run uses (in a correlation) that is not one of
	// its inputs.
	Unknown string
	// Msg says what is wrong and how to fix it, in the input's unit.
	Msg string
}

// Error returns the problem as "input: message" (or "setting: message").
func (e *InputError) Error() string {
	where := e.Input
	if where == "" {
		where = e.Setting
		if e.Index > 0 {
			where = fmt.Sprintf("%s[%d]", e.Setting, e.Index)
		}
	}
	if strings.HasPrefix(e.Msg, "= ") {
		return where + " " + e.Msg
	}
	return where + ": " + e.Msg
}

// InputErrors is every problem found in a Run, as Estimate and
// Run.Validate return them.
type InputErrors []*InputError

// Error returns every problem, one a line.
func (es InputErrors) Error() string {
	lines := make([]string, len(es))
	for i, e := range es {
		lines[i] = e.Error()
	}
	return strings.Join(lines, "\n")
}

// problems collects the InputErrors of one validation, and the warnings
// that do not stop a run.
type problems struct{ list, warnings InputErrors }

func (p *problems) add(e *InputError) { p.list = append(p.list, e) }

func (p *problems) input(name, format string, args ...any) {
	p.add(&InputError{Input: name, Msg: fmt.Sprintf(format, args...)})
}

func (p *problems) setting(name string, index int, format string, args ...any) {
	p.add(&InputError{Setting: name, Index: index, Msg: fmt.Sprintf(format, args...)})
}

func (p *problems) err() error {
	if len(p.list) == 0 {
		return nil
	}
	return p.list
}

// Validate checks r as Estimate does and returns every problem found, as
// InputErrors, or nil.
func (r *Run) Validate() error {
	_, err := r.Check()
	return err
}

// Check checks r as Estimate does and returns every problem found, as
// InputErrors, and the warnings that would not stop the run: inputs
// outside the ranges common in practice.
func (r *Run) Check() (warnings InputErrors, err error) {
	c, err := r.resolve()
	if c != nil {
		warnings = c.warnings
	}
	return warnings, err
}

// input is an input of a checked run: a field with its distribution
// fitted to the field's domain, or the default of a field not given.
type input struct {
	Field
	fi    int    // index of the field in the model's Fields
	name  string // in the unit given
	unit  Unit
	dist  sampler.Distribution
	fixed bool
}

// checked is a run whose every input has been checked.
type checked struct {
	run    *Run
	trials int
	inputs []input // the inputs given or defaulted, in field order
	fields []Field
	byQ    map[*Quantity]int // index in inputs
	corr   *mat.SymDense     // target rank correlations of the sampled inputs, or nil
	// warnings are the problems that do not stop the run.
	warnings InputErrors
}

// span returns the range of the input of quantity q in the field's own
// unit, and whether q is an input of the run that passed its checks.
func (c *checked) span(q *Quantity) (lo, hi float64, ok bool) {
	i, ok := c.byQ[q]
	if !ok {
		return 0, 0, false
	}
	in := c.inputs[i]
	lo, hi = span(in.dist)
	if in.unit != in.Unit {
		lo, hi = in.Unit.FromSI(in.unit.ToSI(lo)), in.Unit.FromSI(in.unit.ToSI(hi))
	}
	return lo, hi, true
}

// span returns the range of the values a run can meet from d: its support,
// or, for a normal or lognormal, its tailMass and 1 − tailMass quantiles
// (the ends of a support such as a lognormal's 0 are never met).
func span(d sampler.Distribution) (lo, hi float64) {
	if _, ok := d.(sampler.Truncated); ok {
		return d.Quantile(tailMass), d.Quantile(1 - tailMass)
	}
	return d.Support()
}

// resolve checks r and returns it checked, or every problem found.
func (r *Run) resolve() (*checked, error) {
	var p problems
	if r.Model == nil {
		p.setting("model", 0, "no model: set Model to a *rockheat.Reservoir, *rockheat.HotRock or *rockheat.PowerDensity")
		return nil, p.err()
	}
	checkTitle(&p, r.Title)
	c := &checked{run: r, trials: r.Trials, byQ: map[*Quantity]int{}}
	switch {
	case r.Trials == 0:
		c.trials = DefaultTrials
	case r.Trials < 0:
		p.setting("trials", 0, "= %d must be a positive number of trials (the default is %d)", r.Trials, DefaultTrials)
	case r.Trials > MaxTrials:
		p.setting("trials", 0, "= %d is more than the %d a run can hold; use fewer trials, or a precision target to stop when the percentiles are settled", r.Trials, int64(MaxTrials))
	}
	c.fields = r.Model.Fields()
	for fi, f := range c.fields {
		if in, ok := checkInput(&p, f); ok {
			in.fi = fi
			c.byQ[f.Q] = len(c.inputs)
			c.inputs = append(c.inputs, in)
		}
	}
	r.Model.check(&p, c)
	c.correlations(&p)
	c.warnings = p.warnings
	if err := p.err(); err != nil {
		return &checked{warnings: p.warnings}, err
	}
	return c, nil
}

// MaxTitleRunes bounds the length of a run's title.
const MaxTitleRunes = 200

// checkTitle reports a title that reports could not show as it is written:
// control characters (a newline would break the text report's layout) and
// bidirectional controls (which can reverse the text around them), or one
// too long for a heading.
func checkTitle(p *problems, title string) {
	for i, c := range title {
		switch {
		case c == utf8.RuneError:
			p.setting("title", 0, "is not valid UTF-8 text (byte %d); save the file as UTF-8", i)
			return
		case unicode.IsControl(c):
			p.setting("title", 0, "holds a control character (%U) at byte %d; write the title on one line, as plain text", c, i)
			return
		case unicode.Is(unicode.Bidi_Control, c):
			p.setting("title", 0, "holds a bidirectional control character (%U) at byte %d, which could reverse the report's text; remove it", c, i)
			return
		}
	}
	if n := utf8.RuneCountInString(title); n > MaxTitleRunes {
		p.setting("title", 0, "has %d characters, more than the %d a report heading holds; shorten it", n, MaxTitleRunes)
	}
}

// checkInput checks the quantity of field f: its unit, that it is given
// if it must be, and that it stays in f's domain.
func checkInput(p *problems, f Field) (input, bool) {
	q := *f.Q
	in := input{Field: f, name: f.label(), unit: f.unit(), dist: q.Dist}
	if in.unit.Dim != f.Unit.Dim {
		p.input(in.name, "is given in %s, a unit of %s; give it in a unit of %s such as %s", in.unit.Symbol, dimOf(in.unit), f.Unit.Dim, f.Unit.Symbol)
		return in, false
	}
	if !q.Given() {
		switch f.Need {
		case Required:
			p.add(&InputError{Input: in.name, Missing: true, Msg: fmt.Sprintf("missing: the %s (%s) is required", f.Doc, in.unit.Symbol)})
		case Defaulted:
			in.name, in.unit, in.dist, in.fixed = f.Name(), f.Unit, sampler.Fixed{Value: f.Default}, true
			return in, true
		}
		return in, false
	}
	d, err := fitDomain(q.Dist, f.Valid.in(f.Unit, in.unit), f.Doc, in.unit.Symbol)
	if err != nil {
		p.input(in.name, "%v", err)
		return in, false
	}
	in.dist, in.fixed = d, q.IsFixed()
	typical(p, in, q.Dist)
	return in, true
}

// typical warns of an input, distributed as d before any cut at its valid
// range, that reaches beyond the common-practice range of its kind of
// quantity.
func typical(p *problems, in input, d sampler.Distribution) {
	t := in.Typical.in(in.Unit, in.unit)
	lo, hi := span(d)
	var beyond float64
	switch {
	case lo < t.Lo:
		beyond = lo
	case hi > t.Hi:
		beyond = hi
	default:
		return
	}
	verb := "reaches"
	if in.fixed {
		verb = "is"
	}
	p.warnings = append(p.warnings, &InputError{Input: in.name, Msg: fmt.Sprintf(
		"%s %.6g %s, outside the range %s %s common for the %s; check the value and its unit",
		verb, beyond, in.unit.Symbol, t, in.unit.Symbol, in.Doc)})
}

func dimOf(u Unit) Dimension {
	if u.Dim == "" {
		return "no stated dimension"
	}
	return u.Dim
}

// tailMass is the largest probability a distribution with an unbounded
// tail may put outside an input's physical domain; within it, the tail is
// cut at the domain limit (the draws change by less than that probability).
const tailMass = 1e-6

// fitDomain checks that d stays in the domain dom of a quantity (doc
// describes it, unit is the symbol of its unit), truncating an unbounded
// normal or lognormal tail that reaches past it with negligible
// probability.
func fitDomain(d sampler.Distribution, dom Domain, doc, unit string) (sampler.Distribution, error) {
	if f, ok := d.(sampler.Fixed); ok {
		x := f.Value
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return nil, fmt.Errorf("= %v is not a finite number", x)
		}
		if !dom.Contains(x) {
			return nil, fmt.Errorf("= %g is outside the valid range %s of %s (%s)%s", x, dom, doc, unit, dom.why())
		}
		return d, nil
	}
	t, unbounded := d.(sampler.Truncated)
	lo, hi := d.Support()
	if !unbounded && ((dom.LoOpen && lo == dom.Lo) || (dom.HiOpen && hi == dom.Hi)) {
		return nil, fmt.Errorf("%s reaches the limit %s of %s, which it must stay inside; keep min and max strictly within it", d, dom, doc)
	}
	if lo >= dom.Lo && hi <= dom.Hi {
		return d, nil
	}
	if !unbounded {
		return nil, fmt.Errorf("%s reaches [%g, %g], outside the valid range %s of %s%s; keep min and max within it", d, lo, hi, dom, doc, dom.why())
	}
	if mass := d.Outside(dom.Lo, dom.Hi); mass > tailMass {
		var fix []string // the limits whose own side holds a share of the mass
		if lo < dom.Lo && d.Outside(dom.Lo, inf) > tailMass/2 {
			fix = append(fix, fmt.Sprintf("min = %.6g", dom.Lo))
		}
		if hi > dom.Hi && d.Outside(-inf, dom.Hi) > tailMass/2 {
			fix = append(fix, fmt.Sprintf("max = %.6g", dom.Hi))
		}
		return nil, fmt.Errorf("%s puts %.3g%% of draws outside the valid range %s of %s%s; add %s to truncate it, or narrow the distribution", d, 100*mass, dom, doc, dom.why(), strings.Join(fix, " and "))
	}
	return t.Restrict(dom.Lo, dom.Hi)
}

// correlations checks the run's target rank correlations and builds their
// matrix over the sampled inputs.
func (c *checked) correlations(p *problems) {
	cs := c.run.Correlations
	if len(cs) == 0 {
		return
	}
	var sampled []string
	status := map[string]string{} // name → "sampled" or "fixed"
	for _, in := range c.inputs {
		if in.fixed {
			status[in.name] = "fixed"
			continue
		}
		sampled = append(sampled, in.name)
		status[in.name] = "sampled"
	}
	var pairs []sampler.Pair
	bad := false
	for i, cr := range cs {
		ok := true
		for _, name := range cr.Inputs {
			switch status[name] {
			case "fixed":
				p.setting("correlations", i+1, "%q is a fixed value; only inputs with a distribution can be correlated", name)
				ok = false
			case "":
				if !c.known(name) {
					p.add(&InputError{Setting: "correlations", Index: i + 1, Unknown: name,
						Msg: fmt.Sprintf("%q is not an input of this run; %s", name, sampledText(sampled))})
				}
				ok = false // an input that failed its own checks is reported there
			}
		}
		if ok {
			pairs = append(pairs, sampler.Pair{A: cr.Inputs[0], B: cr.Inputs[1], Rank: cr.Rank})
		}
		bad = bad || !ok
	}
	if bad {
		return
	}
	corr, err := sampler.BuildCorrelation(sampled, pairs)
	if err != nil {
		for _, e := range unjoin(err) {
			p.setting("correlations", 0, "%v", e)
		}
		return
	}
	c.corr = corr
}

// known reports whether name is the name of one of the run's fields.
func (c *checked) known(name string) bool {
	for _, f := range c.fields {
		if f.label() == name {
			return true
		}
	}
	return false
}

func sampledText(names []string) string {
	if len(names) == 0 {
		return "no input is sampled (every input is fixed)"
	}
	return "the sampled inputs are " + strings.Join(names, ", ")
}

func unjoin(err error) []error {
	var j interface{ Unwrap() []error }
	if errors.As(err, &j) {
		return j.Unwrap()
	}
	return []error{err}
}
