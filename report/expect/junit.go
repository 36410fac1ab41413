package expect

import (
	"encoding/xml"
	"io"
	"strconv"
)

// Case is the outcome of checking one scenario, as a JUnit test case.
type Case struct {
	// Name names the scenario, e.g. its path.
	Name string
	// Seconds is the wall time the check took.
	Seconds float64
	// Failure, if not empty, says in one line why the scenario did not
	// hold (its results drifted, or the scenario changed); Error, if not
	// empty, why it could not be checked (a bad scenario, a missing or
	// unreadable expectation). Detail is the text of either: the table of
	// what drifted.
	Failure, Error string
	Detail         string
}

type junitSuites struct {
	XMLName  xml.Name     `xml:"testsuites"`
	Name     string       `xml:"name,attr"`
	Tests    int          `xml:"tests,attr"`
	Failures int          `xml:"failures,attr"`
	Errors   int          `xml:"errors,attr"`
	Time     string       `xml:"time,attr"`
	Suites   []junitSuite `xml:"testsuite"`
}

type junitSuite struct {
	Name     string      `xml:"name,attr"`
	Tests    int         `xml:"tests,attr"`
	Failures int         `xml:"failures,attr"`
	Errors   int         `xml:"errors,attr"`
	Time     string      `xml:"time,attr"`
	Cases    []junitCase `xml:"testcase"`
}

type junitCase struct {
	Name      string        `xml:"name,attr"`
	Classname string        `xml:"classname,attr"`
	Time      string        `xml:"time,attr"`
	Failure   *junitProblem `xml:"failure,omitempty"`
	Error     *junitProblem `xml:"error,omitempty"`
}

type junitProblem struct {
	Message string `xml:"message,attr"`
	Type    string `xml:"type,attr"`
	Text    string `xml:",cdata"`
}

// WriteJUnit writes cases as a JUnit-style XML report: one test suite
// named suite, one test case per scenario, a failure or an error element
// carrying its detail.
func WriteJUnit(w io.Writer, suite string, cases []Case) error {
	s := junitSuite{Name: suite, Tests: len(cases)}
	var total float64
	for _, c := range cases {
		jc := junitCase{Name: c.Name, Classname: suite, Time: seconds(c.Seconds)}
		switch {
		case c.Error != "":
			jc.Error = &junitProblem{Message: c.Error, Type: "error", Text: c.Detail}
			s.Errors++
		case c.Failure != "":
			jc.Failure = &junitProblem{Message: c.Failure, Type: "drift", Text: c.Detail}
			s.Failures++
		}
		total += c.Seconds
		s.Cases = append(s.Cases, jc)
	}
	s.Time = seconds(total)
	doc := junitSuites{Name: suite, Tests: s.Tests, Failures: s.Failures, Errors: s.Errors, Time: s.Time, Suites: []junitSuite{s}}
	if _, err := io.WriteString(w, xml.Header); err != nil {
		return err
	}
	enc := xml.NewEncoder(w)
	enc.Indent("", "  ")
	if err := enc.Encode(doc); err != nil {
		return err
	}
	_, err := io.WriteString(w, "\n")
	return err
}

func seconds(s float64) string { return strconv.FormatFloat(s, 'f', 3, 64) }
