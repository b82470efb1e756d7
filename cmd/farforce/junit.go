package main

import (
	"encoding/xml"
	"io"
	"path/filepath"
	"strings"
)

// JUnit XML as read by CI systems: a testsuites root holding one
// testsuite, one testcase per gate, a failure element on failed gates
// (common practice; the format has no formal standard).
type junitSuites struct {
	XMLName  xml.Name     `xml:"testsuites"`
	Name     string       `xml:"name,attr"`
	Tests    int          `xml:"tests,attr"`
	Failures int          `xml:"failures,attr"`
	Suites   []junitSuite `xml:"testsuite"`
}

type junitSuite struct {
	Name     string      `xml:"name,attr"`
	Tests    int         `xml:"tests,attr"`
	Failures int         `xml:"failures,attr"`
	Errors   int         `xml:"errors,attr"`
	Cases    []junitCase `xml:"testcase"`
}

type junitCase struct {
	Name      string        `xml:"name,attr"`
	ClassName string        `xml:"classname,attr"`
	Failure   *junitFailure `xml:"failure,omitempty"`
	SystemOut string        `xml:"system-out,omitempty"`
}

type junitFailure struct {
	Message string `xml:"message,attr"`
	Type    string `xml:"type,attr"`
	Text    string `xml:",chardata"`
}

// writeJUnit writes the gates of r as JUnit XML: one testcase per gate,
// named by the gate, with the numbers of every check in system-out and,
// for a failed gate, a failure carrying the failing checks.
func writeJUnit(w io.Writer, casePath string, r *caseRun) error {
	class := "farforce.check." + strings.TrimSuffix(filepath.Base(casePath), filepath.Ext(casePath))
	s := junitSuite{Name: "farforce check " + casePath, Tests: len(r.Gates), Failures: r.Failed}
	for _, g := range r.Gates {
		var all, failed []string
		for _, ch := range g.Checks {
			all = append(all, ch.Text)
			if !ch.Passed {
				failed = append(failed, ch.Text)
			}
		}
		c := junitCase{Name: g.Name, ClassName: class, SystemOut: strings.Join(all, "\n")}
		if !g.Passed {
			c.Failure = &junitFailure{Message: g.Message, Type: g.Kind, Text: strings.Join(failed, "\n")}
		}
		s.Cases = append(s.Cases, c)
	}
	root := junitSuites{Name: "farforce", Tests: s.Tests, Failures: s.Failures, Suites: []junitSuite{s}}
	if _, err := io.WriteString(w, xml.Header); err != nil {
		return err
	}
	enc := xml.NewEncoder(w)
	enc.Indent("", "  ")
	if err := enc.Encode(root); err != nil {
		return err
	}
	_, err := io.WriteString(w, "\n")
	return err
}
