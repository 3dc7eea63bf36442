package fitcore

import (
	"fmt"
	"math"
	"sort"
	"strconv"
	"strings"

	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/stat/distuv"

	"fieldfit/fitcore/dense"
)

// summary fills the statistics of res from the solver's final state: the
// weighted Jacobian s.jac and JᵀWJ s.a in working space at s.pv.
func (s *solver) summary(res *Result) {
	np := s.np
	res.N = s.n
	for _, w := range s.p.Weights {
		if w == 0 {
			res.N--
		}
	}
	res.DoF = res.N - np
	res.Cost = s.cost
	res.SSR = 2 * s.cost
	res.Sigma2 = math.NaN()
	if res.DoF > 0 {
		res.Sigma2 = res.SSR / float64(res.DoF)
	}
	res.RMSE = math.Sqrt(res.SSR / float64(res.N))
	res.R2 = math.NaN()
	if y := s.p.Observed; y != nil {
		var sw, mean float64
		for i, v := range y {
			w := s.weight(i)
			sw += w
			mean += w * v
		}
		mean /= sw
		var sst float64
		for i, v := range y {
			sst += s.weight(i) * (v - mean) * (v - mean)
		}
		if sst > 0 {
			res.R2 = 1 - res.SSR/sst
		}
	}

	res.StdErr = nanSlice(np)
	res.Lower = nanSlice(np)
	res.Upper = nanSlice(np)
	res.TValue = math.NaN()
	res.Condition = math.Inf(1)
	names := make([]string, np)
	for j, par := range s.p.Params {
		names[j] = par.Name
		if names[j] == "" {
			names[j] = "#" + strconv.Itoa(j)
		}
	}
	if !res.Status.Converged() {
		res.Warnings = append(res.Warnings, "The fit did not converge ("+res.Status.String()+"); the parameters are the best point reached.")
	}
	for j, par := range s.p.Params {
		if par.bounded() && (s.pv[j] == par.Lower || s.pv[j] == par.Upper) {
			res.Warnings = append(res.Warnings, fmt.Sprintf("Parameter %s is at its bound %g; its uncertainty is not reliable.", names[j], s.pv[j]))
		}
	}

	// JᵀWJ in the problem's space: A_p = S⁻¹ A_q S⁻¹ with S = ∂p/∂q.
	ap := newSym(np)
	scale := make([]float64, np)
	for j := 0; j < np; j++ {
		scale[j] = 1
		if s.p.Params[j].Positive {
			scale[j] = s.pv[j]
		}
	}
	for j := 0; j < np; j++ {
		for k := j; k < np; k++ {
			ap.Data[j*np+k] = symAt(s.a, j, k) / (scale[j] * scale[k])
		}
	}
	// Column scaling to unit diagonal for a meaningful condition number
	// and an accurate factorisation.
	dsc := make([]float64, np)
	scaled := newSym(np)
	for j := 0; j < np; j++ {
		dsc[j] = math.Sqrt(ap.Data[j*np+j])
	}
	for j := 0; j < np; j++ {
		for k := j; k < np; k++ {
			v := 0.0
			if dsc[j] > 0 && dsc[k] > 0 {
				v = ap.Data[j*np+k] / (dsc[j] * dsc[k])
			}
			scaled.Data[j*np+k] = v
		}
	}
	if vals, minVec, ok := symEigen(scaled); ok {
		lo, hi := vals[0], vals[len(vals)-1]
		if lo > 0 {
			res.Condition = hi / lo
		}
		if !(res.Condition <= s.set.IllConditioned) {
			res.Warnings = append(res.Warnings, illConditioned(names, minVec, res.Condition))
		}
	}
	var chol dense.Cholesky
	inv := newSym(np)
	if chol.Factorize(scaled) {
		chol.InverseTo(inv)
	} else {
		res.Warnings = append(res.Warnings, "JᵀWJ is singular at the solution: no standard errors can be given.")
		return
	}
	if math.IsNaN(res.Sigma2) {
		res.Warnings = append(res.Warnings, "No degrees of freedom are left (as many observations as parameters): no standard errors can be given.")
		return
	}
	cov := mat.NewSymDense(np, nil)
	for j := 0; j < np; j++ {
		for k := j; k < np; k++ {
			cov.SetSym(j, k, res.Sigma2*inv.Data[j*np+k]/(dsc[j]*dsc[k]))
		}
	}
	res.Covariance = cov
	corr := mat.NewSymDense(np, nil)
	for j := 0; j < np; j++ {
		res.StdErr[j] = math.Sqrt(cov.At(j, j))
	}
	for j := 0; j < np; j++ {
		for k := j; k < np; k++ {
			corr.SetSym(j, k, cov.At(j, k)/(res.StdErr[j]*res.StdErr[k]))
		}
	}
	res.Correlation = corr
	t := distuv.StudentsT{Mu: 0, Sigma: 1, Nu: float64(res.DoF)}
	res.TValue = t.Quantile(0.5 + s.set.Confidence/2)
	for j, par := range s.p.Params {
		half := res.TValue * res.StdErr[j]
		lo, hi := s.pv[j]-half, s.pv[j]+half
		if par.Positive {
			lo = math.Max(lo, 0)
		}
		if par.bounded() {
			lo, hi = par.clamp(lo), par.clamp(hi)
		}
		res.Lower[j], res.Upper[j] = lo, hi
	}
	for j := 0; j < np; j++ {
		for k := j + 1; k < np; k++ {
			if c := corr.At(j, k); math.Abs(c) > 0.999 {
				res.Warnings = append(res.Warnings, fmt.Sprintf("Parameters %s and %s are correlated at %.4f: the data hardly tell them apart.", names[j], names[k], c))
			}
		}
	}
}

// illConditioned names the parameters that dominate the direction of
// the smallest eigenvalue: the combination the data cannot resolve.
func illConditioned(names []string, vec []float64, cond float64) string {
	np := len(names)
	type comp struct {
		j int
		v float64
	}
	cs := make([]comp, np)
	for j := 0; j < np; j++ {
		cs[j] = comp{j, math.Abs(vec[j])}
	}
	sort.Slice(cs, func(a, b int) bool { return cs[a].v > cs[b].v })
	var which []string
	for _, c := range cs {
		if c.v >= 0.3 || len(which) < 2 {
			which = append(which, names[c.j])
		}
	}
	if len(which) > np {
		which = which[:np]
	}
	cstr := "infinite"
	if !math.IsInf(cond, 1) {
		cstr = fmt.Sprintf("%.3g", cond)
	}
	return fmt.Sprintf("The data cannot tell apart parameters %s (condition number %s): their values and uncertainties are not identifiable from these readings.",
		strings.Join(which, ", "), cstr)
}

func (s *solver) weight(i int) float64 {
	if s.p.Weights == nil {
		return 1
	}
	return s.p.Weights[i]
}

func nanSlice(n int) []float64 {
	v := make([]float64, n)
	for i := range v {
		v[i] = math.NaN()
	}
	return v
}

type wrapped struct {
	sentinel error
	msg      string
}

func (w *wrapped) Error() string { return w.msg + ": " + w.sentinel.Error() }
func (w *wrapped) Unwrap() error { return w.sentinel }

func wrap(sentinel error, msg string) error { return &wrapped{sentinel, msg} }

func itoa(i int) string { return strconv.Itoa(i) }
