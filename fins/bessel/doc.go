// Package bessel evaluates the modified Bessel functions of the first and
// second kind of orders 0 and 1, I0, I1, K0, K1, and their exponentially
// scaled forms, which the annular and tapered fin solutions need and which
// neither the Go standard library nor gonum provides.
//
// Methods (x in the argument's own units, dimensionless):
//   - I0, I1 for x <= 25: the ascending series, Abramowitz & Stegun (1964)
//     Eq. 9.6.10; every term is positive, so it is accurate to rounding.
//   - I0, I1 for x > 25: the asymptotic expansion A&S Eq. 9.7.1, summed
//     until the terms stop falling; at x = 25 the smallest term is below
//     1e-20.
//   - K0, K1 for x <= 2: the series A&S Eqs. 9.6.13 and 9.6.11.
//   - K0, K1 for x > 2: Chebyshev series of sqrt(x) exp(x) K_n(x) in
//     t = 4/x - 1 (the form the Cephes library uses, Moshier 1989), summed
//     by Clenshaw's recurrence (Numerical Recipes 3rd ed. 2007, Eq. 5.8.11);
//     the coefficients in kcheb.go are computed with mpmath by
//     testdata/reference/gen_bessel_cheb.py.
//
// Accuracy, checked against mpmath and scipy values in
// testdata/reference/bessel.csv: better than 1e-13 relative for
// 1e-4 <= x <= 700. The unscaled I overflow to +Inf and K underflow to 0
// beyond about x = 700; use the scaled forms there. Non-positive x for K and
// negative x for I return NaN for K and the even/odd extension for I.
package bessel
