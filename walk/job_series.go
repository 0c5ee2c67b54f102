package walk

// runSeries answers a series job: the regime analysis of a given curve.
func (j *Job) runSeries() (*Response, error) {
	s := j.Series
	if err := s.validate(); err != nil {
		return nil, err
	}
	if j.Fit.Segments == 0 {
		j.Fit.Segments = 4
	}
	resp := &Response{ID: j.ID}
	if err := j.regimes(resp, s.Times, s.Values, s.Errors); err != nil {
		return nil, err
	}
	return resp, nil
}
