package spectra

import "strconv"

func itoa(i int) string     { return strconv.Itoa(i) }
func ftoa(x float64) string { return strconv.FormatFloat(x, 'g', 6, 64) }
