package measure

import (
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"math"
	"sort"
	"strconv"
	"strings"

	"github.com/ampwalk/ampwalk/internal/fault"
)

// InputError is the error returned for input outside its accepted range. It
// names the field, the accepted range and the value received.
type InputError = fault.Error

// Measurement holds per-site intensities at several propagation lengths.
type Measurement struct {
	// Lengths in increasing order.
	Lengths []float64
	// Intensity[k][j] is the intensity of site j at Lengths[k].
	Intensity [][]float64
	// Uncertainty[k][j] is its standard deviation; nil when not measured.
	Uncertainty [][]float64
	// Line[k] is the 1-based CSV line of the first row of Lengths[k]
	// (zero when the Measurement was not read from a file).
	Line []int
}

// Sites returns the number of sites.
func (m *Measurement) Sites() int {
	if len(m.Intensity) == 0 {
		return 0
	}
	return len(m.Intensity[0])
}

// maxCSVRows bounds the rows read (10⁸ sites·lengths), so that a wrong file
// cannot exhaust memory.
const maxCSVRows = 100_000_000

// ReadCSV reads a measurement of sites sites from r. The first record is the
// header: the columns length, site, intensity and optionally uncertainty, in
// any order, case and surrounding spaces ignored; any other column is an
// error. Lines starting with '#' are comments. Each row must have a finite
// length ≥ 0, an integer site in [0, sites), a finite intensity ≥ 0 and, with
// the column, a finite uncertainty ≥ 0. A (length, site) pair may appear only
// once, every length must list every site, and the total intensity at each
// length must be positive. Any violation returns an *InputError whose message
// starts with the 1-based line number, and no Measurement.
func ReadCSV(r io.Reader, sites int) (*Measurement, error) {
	if sites < 1 || sites > maxCSVRows {
		return nil, fault.Range("sites", "between 1 and "+strconv.Itoa(maxCSVRows), sites)
	}
	cr := csv.NewReader(r)
	cr.Comment = '#'
	cr.TrimLeadingSpace = true
	cr.FieldsPerRecord = -1
	header, err := cr.Read()
	if err == io.EOF {
		return nil, fault.New("csv", "must start with a header naming the columns length, site, intensity[, uncertainty]; got an empty file")
	}
	if err != nil {
		return nil, csvError(err)
	}
	hline, _ := cr.FieldPos(0)
	col := map[string]int{"length": -1, "site": -1, "intensity": -1, "uncertainty": -1}
	for i, h := range header {
		name := strings.ToLower(strings.TrimSpace(strings.TrimPrefix(h, "\ufeff")))
		c, ok := col[name]
		switch {
		case !ok:
			return nil, fault.New("csv.header", "line %d: column %d must be one of length, site, intensity, uncertainty; got %q", hline, i+1, h)
		case c >= 0:
			return nil, fault.New("csv.header", "line %d: column %q must appear once; it is both column %d and %d", hline, name, c+1, i+1)
		}
		col[name] = i
	}
	for _, need := range []string{"length", "site", "intensity"} {
		if col[need] < 0 {
			return nil, fault.New("csv.header", "line %d: must name the column %q (required columns: length, site, intensity; optional: uncertainty); got %q", hline, need, strings.Join(header, ","))
		}
	}
	hasU := col["uncertainty"] >= 0

	type row struct {
		z    float64
		site int
		i, u float64
		line int
	}
	var rows []row
	for {
		rec, err := cr.Read()
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, csvError(err)
		}
		line, _ := cr.FieldPos(0)
		if len(rec) != len(header) {
			return nil, fault.New("csv", "line %d: must have %d fields like the header; got %d", line, len(header), len(rec))
		}
		if len(rows) >= maxCSVRows {
			return nil, fault.New("csv", "line %d: must have at most %d data rows", line, maxCSVRows)
		}
		num := func(name string, min float64) (float64, error) {
			s := strings.TrimSpace(rec[col[name]])
			v, err := strconv.ParseFloat(s, 64)
			if err != nil || math.IsNaN(v) || math.IsInf(v, 0) || v < min {
				return 0, fault.New("csv."+name, "line %d: must be a finite number ≥ %g; got %q", line, min, s)
			}
			return v, nil
		}
		var x row
		x.line = line
		if x.z, err = num("length", 0); err != nil {
			return nil, err
		}
		s := strings.TrimSpace(rec[col["site"]])
		site, perr := strconv.Atoi(s)
		if perr != nil || site < 0 || site >= sites {
			return nil, fault.New("csv.site", "line %d: must be an integer site index between 0 and %d; got %q", line, sites-1, s)
		}
		x.site = site
		if x.i, err = num("intensity", 0); err != nil {
			return nil, err
		}
		if hasU {
			if x.u, err = num("uncertainty", 0); err != nil {
				return nil, err
			}
		}
		rows = append(rows, x)
	}
	if len(rows) == 0 {
		return nil, fault.New("csv", "must hold at least one data row after the header; got none")
	}

	// Group by length, keeping the first line of each.
	sort.SliceStable(rows, func(a, b int) bool { return rows[a].z < rows[b].z })
	m := &Measurement{}
	for a := 0; a < len(rows); {
		b := a
		for b < len(rows) && rows[b].z == rows[a].z {
			b++
		}
		first := rows[a].line
		seen := make([]int, sites) // line of each site, 0 when absent
		in := make([]float64, sites)
		var un []float64
		if hasU {
			un = make([]float64, sites)
		}
		var total float64
		for _, x := range rows[a:b] {
			first = min(first, x.line)
			if seen[x.site] != 0 {
				l1, l2 := min(seen[x.site], x.line), max(seen[x.site], x.line)
				return nil, fault.New("csv.site", "line %d: (length %g, site %d) must appear once; it already appears on line %d", l2, x.z, x.site, l1)
			}
			seen[x.site] = x.line
			in[x.site] = x.i
			total += x.i
			if hasU {
				un[x.site] = x.u
			}
		}
		for j, l := range seen {
			if l == 0 {
				return nil, fault.New("csv.site", "line %d: length %g (first row on that line) must list every site 0…%d; site %d is missing", first, rows[a].z, sites-1, j)
			}
		}
		if !(total > 0) || math.IsInf(total, 0) {
			return nil, fault.New("csv.intensity", "line %d: the intensities at length %g must have a positive finite sum; got %g", first, rows[a].z, total)
		}
		m.Lengths = append(m.Lengths, rows[a].z)
		m.Intensity = append(m.Intensity, in)
		if hasU {
			m.Uncertainty = append(m.Uncertainty, un)
		}
		m.Line = append(m.Line, first)
		a = b
	}
	return m, nil
}

// csvError turns an encoding/csv error into an *InputError with its line.
func csvError(err error) error {
	var pe *csv.ParseError
	if errors.As(err, &pe) {
		return fault.New("csv", "line %d: must be valid CSV; %v", pe.Line, pe.Err)
	}
	return fault.New("csv", "must be readable; %v", err)
}

// WriteCSV writes m in the format ReadCSV reads (with the uncertainty column
// when m has uncertainties), lengths in order and sites within each length.
func (m *Measurement) WriteCSV(w io.Writer) error {
	cw := csv.NewWriter(w)
	h := []string{"length", "site", "intensity"}
	if m.Uncertainty != nil {
		h = append(h, "uncertainty")
	}
	if err := cw.Write(h); err != nil {
		return err
	}
	g := func(x float64) string { return strconv.FormatFloat(x, 'g', 10, 64) }
	for k, z := range m.Lengths {
		for j, v := range m.Intensity[k] {
			rec := []string{g(z), strconv.Itoa(j), g(v)}
			if m.Uncertainty != nil {
				rec = append(rec, g(m.Uncertainty[k][j]))
			}
			if err := cw.Write(rec); err != nil {
				return err
			}
		}
	}
	cw.Flush()
	if err := cw.Error(); err != nil {
		return fmt.Errorf("measure: writing CSV: %w", err)
	}
	return nil
}
