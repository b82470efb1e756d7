package main

import (
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
	"unicode/utf8"
)

// table is a plain-text table: a header row and data rows, columns
// separated by two spaces, every line indented by two spaces. align has
// one letter per column, 'l' (left) or 'r' (right); when it is empty the
// first column is left-aligned and the others right-aligned.
type table struct {
	header []string
	align  string
	rows   [][]string
}

func (t *table) add(cells ...string) { t.rows = append(t.rows, cells) }

// write prints the table. A row may be shorter than the header: the missing
// cells are blank.
func (t *table) write(w io.Writer) {
	width := make([]int, len(t.header))
	all := append([][]string{t.header}, t.rows...)
	for _, r := range all {
		for i, c := range r {
			width[i] = max(width[i], utf8.RuneCountInString(c))
		}
	}
	for _, r := range all {
		var b strings.Builder
		b.WriteString("  ")
		for i := range t.header {
			c := ""
			if i < len(r) {
				c = r[i]
			}
			pad := strings.Repeat(" ", width[i]-utf8.RuneCountInString(c))
			if i > 0 {
				b.WriteString("  ")
			}
			if t.left(i) {
				b.WriteString(c + pad)
			} else {
				b.WriteString(pad + c)
			}
		}
		fmt.Fprintln(w, strings.TrimRight(b.String(), " "))
	}
}

// left reports whether column i is left-aligned.
func (t *table) left(i int) bool {
	if i < len(t.align) {
		return t.align[i] == 'l'
	}
	return i == 0
}

// fixedFormatter returns a formatter that prints numbers with the number of
// decimals that gives 6 significant digits to the largest magnitude in
// vals, so that a column of force terms lines up and rounding noise shows as
// zeros. Values are rounded, never dropped: use JSON or CSV for all digits.
func fixedFormatter(vals ...float64) func(float64) string {
	m := 0.0
	for _, v := range vals {
		if !math.IsNaN(v) && !math.IsInf(v, 0) {
			m = math.Max(m, math.Abs(v))
		}
	}
	if m == 0 {
		return func(v float64) string { return strconv.FormatFloat(v, 'g', 6, 64) }
	}
	dec := 5 - int(math.Floor(math.Log10(m)))
	if dec < 0 || dec > 12 {
		return func(v float64) string { return strconv.FormatFloat(v, 'g', 6, 64) }
	}
	return func(v float64) string { return fixed(v, dec) }
}

// fixed formats v with dec decimals, without a minus sign on a zero.
func fixed(v float64, dec int) string {
	s := strconv.FormatFloat(v, 'f', dec, 64)
	if strings.Trim(s, "-0.") == "" {
		s = strings.TrimPrefix(s, "-")
	}
	return s
}
