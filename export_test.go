package tiltwell

// Orders is the number of Gauss–Legendre orders in the overlap ladder.
var Orders = len(orders)

// OverlapRule returns the nodes of the o-th rule of the ladder, and a
// function that integrates the product of two sets of values at them with
// the error estimate Sweep reports.
func OverlapRule(o int) (x []float64, integ func(ve, vh []float64) (q, est float64)) {
	r := rules[o]()
	return r.x, func(ve, vh []float64) (float64, float64) { return integrate(r, ve, vh) }
}
