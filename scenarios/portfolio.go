package scenarios

import (
	"embed"
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"sort"
	"strings"

	"github.com/BurntSushi/toml"

	"rockheat"
)

//go:embed portfolios/*.toml
var portfoliosFS embed.FS

// PortfolioFile is a checked portfolio file and the scenarios it names.
type PortfolioFile struct {
	// Portfolio is the portfolio the file describes, ready to estimate.
	Portfolio rockheat.Portfolio
	// Scenarios are the prospects' scenarios, in the order of the
	// prospects (their warnings reach the result through each prospect's
	// Run).
	Scenarios []*Scenario
}

// ChanceFactors are the named components a chance of success may be
// given as; the chance is their product.
var ChanceFactors = map[string]string{
	"temperature":  "the reservoir is as hot as the scenario assumes",
	"permeability": "the rock flows enough for production wells",
	"fluid":        "there is fluid, of a chemistry a plant can use",
	"seal":         "a cap rock holds the heat and the fluid in place",
}

// rawPortfolio is a portfolio file as decoded.
type rawPortfolio struct {
	Title string `toml:"title"`
	Run   struct {
		rawRun
		TargetMWe *float64 `toml:"target_mwe"`
	} `toml:"run"`
	Prospects []struct {
		Name     string   `toml:"name"`
		Scenario string   `toml:"scenario"`
		Chance   any      `toml:"chance_of_success"`
		Share    *float64 `toml:"share"`
	} `toml:"prospects"`
	Shared []struct {
		Input     string   `toml:"input"`
		Prospects []string `toml:"prospects"`
	} `toml:"shared"`
	Correlations        []rawLink `toml:"correlations"`
	SuccessCorrelations []rawLink `toml:"success_correlations"`
}

type rawLink struct {
	Prospects []string `toml:"prospects"`
	Rank      *float64 `toml:"rank"`
}

// LoadPortfolio reads the portfolio at arg: a file path, or the name of a
// bundled portfolio when no such file exists and arg has no .toml suffix.
// Each prospect's scenario is a path relative to the portfolio's folder or
// the name of a bundled example. It returns every problem found, in the
// portfolio and in its scenarios, as Problems.
func LoadPortfolio(arg string) (*PortfolioFile, error) {
	if bundledName(arg) {
		if text, err := PortfolioText(arg); err == nil {
			return ParsePortfolio("portfolio "+arg, "", text)
		}
	}
	src, err := readLimited(arg)
	if err != nil {
		return nil, err
	}
	return ParsePortfolio(arg, filepath.Dir(arg), src)
}

// PortfolioText returns the text of the bundled portfolio name.
func PortfolioText(name string) ([]byte, error) {
	return portfoliosFS.ReadFile("portfolios/" + name + ".toml")
}

// BundledPortfolios returns the names of the bundled portfolios.
func BundledPortfolios() []string {
	entries, _ := portfoliosFS.ReadDir("portfolios")
	var names []string
	for _, e := range entries {
		names = append(names, strings.TrimSuffix(e.Name(), ".toml"))
	}
	sort.Strings(names)
	return names
}

// ParsePortfolio checks the portfolio text src, read from path (used in
// messages); scenario paths are relative to dir, and a dir of "" means the
// scenarios are bundled examples only.
func ParsePortfolio(path, dir string, src []byte) (*PortfolioFile, error) {
	var r rawPortfolio
	md, err := toml.Decode(string(src), &r)
	if err != nil {
		return nil, Problems{syntaxProblem(path, src, err)}
	}
	c := &checker{path: path, lines: indexLines(src), bad: map[string]bool{}}
	for _, k := range md.Undecoded() {
		if len(k) > 1 && k[0] == "prospects" && k[1] == "chance_of_success" {
			continue // the factors of a chance, checked below
		}
		c.add(k.String(), "unknown key%s; remove it or correct its spelling", suggest(k.String(), portfolioKeys))
	}
	pf := &PortfolioFile{}
	p := &pf.Portfolio
	p.Title = strings.TrimSpace(r.Title)
	if p.Title == "" {
		c.add("title", "missing; give the portfolio a title, e.g. title = \"Licence block portfolio\"")
	}
	c.portfolioRun(p, &r)
	for i, rp := range r.Prospects {
		key := fmt.Sprintf("prospects[%d]", i+1)
		pr := rockheat.Prospect{Name: rp.Name}
		if rp.Share != nil {
			pr.Share = *rp.Share
			if pr.Share == 0 {
				c.add(key, "share = 0 holds no interest; give a working-interest fraction in (0, 1] or remove the prospect")
			}
		}
		c.chance(key, rp.Chance, &pr)
		if rp.Scenario == "" {
			c.add(key, "needs scenario = \"FILE.toml\" (relative to this file) or the name of a bundled example")
		} else if s, err := loadProspect(dir, rp.Scenario); err != nil {
			var ps Problems
			if errors.As(err, &ps) {
				c.problems = append(c.problems, ps...)
			} else {
				c.add(key, "scenario %q: %v", rp.Scenario, err)
			}
		} else {
			pr.Run = &s.Run
			pf.Scenarios = append(pf.Scenarios, s)
		}
		p.Prospects = append(p.Prospects, pr)
	}
	for _, sh := range r.Shared {
		p.Shared = append(p.Shared, rockheat.SharedInput{Input: sh.Input, Prospects: sh.Prospects})
	}
	p.Correlations = c.links("correlations", r.Correlations)
	p.SuccessCorrelations = c.links("success_correlations", r.SuccessCorrelations)
	if len(c.problems) == 0 {
		var es rockheat.InputErrors
		if err := p.Validate(); errors.As(err, &es) {
			for _, e := range es {
				key := e.Setting
				if k, ok := portfolioSetting[key]; ok {
					key = k
				}
				if e.Index > 0 {
					key = fmt.Sprintf("%s[%d]", key, e.Index)
				}
				c.add(key, "%s", e.Msg)
			}
		}
	}
	if len(c.problems) > 0 {
		return nil, c.problems
	}
	return pf, nil
}

var portfolioKeys = []string{"title", "run.trials", "run.seed", "run.sampling", "run.target_mwe", "prospects",
	"prospects.name", "prospects.scenario", "prospects.chance_of_success", "prospects.share", "shared", "shared.input",
	"shared.prospects", "correlations", "correlations.prospects", "correlations.rank", "success_correlations"}

var portfolioSetting = map[string]string{"trials": "run.trials", "target_mwe": "run.target_mwe"}

// portfolioRun reads the portfolio's [run] table.
func (c *checker) portfolioRun(p *rockheat.Portfolio, r *rawPortfolio) {
	p.Trials, p.Seed, p.Sampling = c.runTable(r.Run.rawRun)
	if r.Run.TargetMWe != nil {
		p.TargetMWe = *r.Run.TargetMWe
	}
}

// chance reads a chance of success: a probability, or a table of named
// factors whose product it is.
func (c *checker) chance(key string, v any, pr *rockheat.Prospect) {
	switch x := v.(type) {
	case nil:
		c.add(key, "needs chance_of_success = a probability in [0, 1], or a table of factors such as { temperature = 0.8, permeability = 0.6 }")
	case map[string]any:
		if len(x) == 0 {
			c.add(key+".chance_of_success", "is an empty table; give a probability in [0, 1], or at least one factor such as { temperature = 0.8 }")
			return
		}
		names := make([]string, 0, len(x))
		for name := range x {
			names = append(names, name)
		}
		sort.Strings(names)
		known := make([]string, 0, len(ChanceFactors))
		for name := range ChanceFactors {
			known = append(known, name)
		}
		sort.Strings(known)
		for _, name := range names {
			p, ok := number(x[name])
			switch {
			case ChanceFactors[name] == "":
				c.add(key+".chance_of_success."+name, "is not a chance factor rockheat knows%s; the factors are %s", suggest(name, known), strings.Join(known, ", "))
			case !ok:
				c.add(key+".chance_of_success."+name, "= %v must be a probability in [0, 1]", quoteAny(x[name]))
			default:
				pr.Factors = append(pr.Factors, rockheat.ChanceFactor{Name: name, Chance: p})
			}
		}
	default:
		p, ok := number(v)
		if !ok {
			c.add(key+".chance_of_success", "= %v must be a probability in [0, 1], or a table of factors", quoteAny(v))
			return
		}
		pr.Chance = p
	}
}

// links reads a list of prospect rank correlations.
func (c *checker) links(key string, raw []rawLink) []rockheat.ProspectCorrelation {
	var out []rockheat.ProspectCorrelation
	for i, l := range raw {
		if len(l.Prospects) != 2 || l.Rank == nil {
			c.add(fmt.Sprintf("%s[%d]", key, i+1), "each needs prospects = [\"a\", \"b\"] and rank = a number in [-1, 1]")
			continue
		}
		out = append(out, rockheat.ProspectCorrelation{Prospects: [2]string{l.Prospects[0], l.Prospects[1]}, Rank: *l.Rank})
	}
	return out
}

// loadProspect reads a prospect's scenario: a file relative to dir, or a
// bundled example.
func loadProspect(dir, name string) (*Scenario, error) {
	if dir != "" && !filepath.IsAbs(name) {
		if p := filepath.Join(dir, name); fileExists(p) {
			return LoadFile(p)
		}
	}
	if dir == "" || !strings.HasSuffix(name, ".toml") {
		if ex, err := LookupExample(name); err == nil {
			return Parse("example "+ex.Name, ex.Text)
		}
	}
	return LoadFile(filepath.Join(dir, name))
}

func fileExists(p string) bool {
	_, err := os.Stat(p)
	return err == nil
}
