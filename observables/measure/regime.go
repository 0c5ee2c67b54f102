package measure

// reportRegimes writes the regime analysis; a no-op until FitRegimes ran.
func (r *Reduction) reportRegimes(p func(string, ...any), lu string) {}
