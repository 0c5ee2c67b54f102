package plan

import (
	"encoding/csv"
	"encoding/json"
	"io"
	"strconv"
)

// WriteCSV writes the proposed samples as CSV with the header
// sample,length,regime,kind,msd,msd_spread (sample numbered from 1).
func (pl *Plan) WriteCSV(w io.Writer) error {
	cw := csv.NewWriter(w)
	_ = cw.Write([]string{"sample", "length", "regime", "kind", "msd", "msd_spread"})
	f := func(x float64) string { return strconv.FormatFloat(x, 'g', 6, 64) }
	for i, s := range pl.Samples {
		_ = cw.Write([]string{strconv.Itoa(i + 1), f(s.Length), strconv.Itoa(s.Regime), s.Kind, f(s.MSD), f(s.MSDSpread)})
	}
	cw.Flush()
	return cw.Error()
}

// WriteJSON writes the plan (grid, curves, regimes, samples, rationale) as
// one indented JSON object.
func (pl *Plan) WriteJSON(w io.Writer) error {
	e := json.NewEncoder(w)
	e.SetIndent("", "  ")
	return e.Encode(pl)
}
