package transient

import (
	"errors"
	"math"
)

// The Dormand–Prince 5(4) embedded Runge–Kutta pair (J. R. Dormand and
// P. J. Prince, "A family of embedded Runge-Kutta formulae", J. Comput.
// Appl. Math. 6 (1980) 19-26; coefficients as tabulated in E. Hairer,
// S. P. Nørsett and G. Wanner, Solving Ordinary Differential Equations I,
// 2nd ed., Springer 1993, Table II.5.2). The fifth-order solution is
// propagated (local extrapolation) and the difference from the embedded
// fourth-order one estimates the local error; the last stage is the
// derivative at the step's end, reused as the next step's first (FSAL).
var (
	dpC = [7]float64{0, 1.0 / 5, 3.0 / 10, 4.0 / 5, 8.0 / 9, 1, 1}
	dpA = [7][6]float64{
		{},
		{1.0 / 5},
		{3.0 / 40, 9.0 / 40},
		{44.0 / 45, -56.0 / 15, 32.0 / 9},
		{19372.0 / 6561, -25360.0 / 2187, 64448.0 / 6561, -212.0 / 729},
		{9017.0 / 3168, -355.0 / 33, 46732.0 / 5247, 49.0 / 176, -5103.0 / 18656},
		{35.0 / 384, 0, 500.0 / 1113, 125.0 / 192, -2187.0 / 6784, 11.0 / 84},
	}
	// fifth-order weights (the last row of dpA) and fourth-order weights
	dpB5 = [7]float64{35.0 / 384, 0, 500.0 / 1113, 125.0 / 192, -2187.0 / 6784, 11.0 / 84, 0}
	dpB4 = [7]float64{5179.0 / 57600, 0, 7571.0 / 16695, 393.0 / 640, -92097.0 / 339200, 187.0 / 2100, 1.0 / 40}
)

// Func is the right-hand side y' = f(t, y): it writes the derivative of y
// at t into dy, or returns an error that stops the integration.
type Func func(t float64, y, dy []float64) error

// Tolerances of the step control: a step is accepted when the RMS over the
// components of err_i / (Abs + Rel max(|y_i|, |y_new,i|)) is at most 1.
type Tolerances struct {
	Abs, Rel float64
	MaxStep  float64 // s; 0 for none
}

// ErrStepTooSmall is returned when the step control cannot meet the
// tolerances with a step above 1e-12 of the span.
var ErrStepTooSmall = errors.New("step size underflow: the equations are too stiff or not smooth for the explicit integrator")

// Step is one accepted step, for dense output: the state and derivative at
// both ends (cubic Hermite interpolation between them).
type Step struct {
	T0, T1   float64
	Y0, Y1   []float64
	DY0, DY1 []float64
}

// At interpolates the step at t in [T0, T1] into y by the cubic Hermite
// polynomial through both ends' values and derivatives (third order; the
// integrator's own solution at the ends is fifth order).
func (s *Step) At(t float64, y []float64) {
	h := s.T1 - s.T0
	th := (t - s.T0) / h
	h00 := (1 + 2*th) * (1 - th) * (1 - th)
	h10 := th * (1 - th) * (1 - th)
	h01 := th * th * (3 - 2*th)
	h11 := th * th * (th - 1)
	for i := range y {
		y[i] = h00*s.Y0[i] + h*h10*s.DY0[i] + h01*s.Y1[i] + h*h11*s.DY1[i]
	}
}

// Integrate advances y from t0 to t1 (t1 > t0) with the Dormand–Prince
// pair and standard step control (Hairer, Nørsett and Wanner 1993, II.4:
// h_new = h min(5, max(0.2, 0.9 err^(-1/5)))). h0 is the first trial step
// (0: a twentieth of the span). It calls each with every accepted step and
// returns the number of right-hand-side evaluations and the last accepted
// step size (a good first trial for a following span).
func Integrate(f Func, t0, t1 float64, y []float64, h0 float64, tol Tolerances, each func(*Step) error) (evals int, hLast float64, err error) {
	n := len(y)
	var k [7][]float64
	for i := range k {
		k[i] = make([]float64, n)
	}
	yt, y5 := make([]float64, n), make([]float64, n)
	span := t1 - t0
	h := h0
	if h <= 0 {
		h = span / 20
	}
	if tol.MaxStep > 0 {
		h = math.Min(h, tol.MaxStep)
	}
	if err := f(t0, y, k[0]); err != nil {
		return 1, 0, err
	}
	evals = 1
	t := t0
	st := Step{Y0: make([]float64, n), Y1: make([]float64, n), DY0: make([]float64, n), DY1: make([]float64, n)}
	for t < t1 {
		last := false
		if t+h >= t1-1e-12*span {
			h, last = t1-t, true
		}
		for s := 1; s < 7; s++ {
			for i := 0; i < n; i++ {
				acc := y[i]
				for j := 0; j < s; j++ {
					acc += h * dpA[s][j] * k[j][i]
				}
				yt[i] = acc
			}
			if err := f(t+dpC[s]*h, yt, k[s]); err != nil {
				return evals, h, err
			}
			evals++
		}
		// yt now holds the fifth-order solution (stage 7's argument)
		copy(y5, yt)
		var sum float64
		for i := 0; i < n; i++ {
			var e float64
			for j := 0; j < 7; j++ {
				e += h * (dpB5[j] - dpB4[j]) * k[j][i]
			}
			sc := tol.Abs + tol.Rel*math.Max(math.Abs(y[i]), math.Abs(y5[i]))
			sum += (e / sc) * (e / sc)
		}
		errNorm := math.Sqrt(sum / float64(n))
		if errNorm <= 1 {
			st.T0, st.T1 = t, t+h
			copy(st.Y0, y)
			copy(st.DY0, k[0])
			copy(st.Y1, y5)
			copy(st.DY1, k[6])
			copy(y, y5)
			copy(k[0], k[6]) // FSAL
			t += h
			hLast = h
			if each != nil {
				if err := each(&st); err != nil {
					return evals, hLast, err
				}
			}
			if last {
				break
			}
		}
		if math.IsNaN(errNorm) {
			return evals, h, errors.New("the right-hand side is not a finite number")
		}
		fac := 5.0
		if errNorm > 0 {
			fac = math.Min(5, math.Max(0.2, 0.9*math.Pow(errNorm, -0.2)))
		}
		h *= fac
		if tol.MaxStep > 0 {
			h = math.Min(h, tol.MaxStep)
		}
		if h < 1e-12*span {
			return evals, h, ErrStepTooSmall
		}
	}
	return evals, hLast, nil
}
