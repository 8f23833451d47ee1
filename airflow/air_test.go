package airflow

import (
	"math"
	"testing"

	"finmarch/fins/validity"
)

// Incropera, DeWitt, Bergman & Lavine, Fundamentals of Heat and Mass
// Transfer, 6th ed. (2007), Table A.4, air at atmospheric pressure (from
// memory). The table's densities agree with the ideal gas at 100 kPa to
// 0.05%, so density is compared at that pressure; the transport properties
// hardly depend on pressure. Tolerances: 0.3% for density (ideal gas),
// 1.5% for cp and viscosity (the table's own scatter against the fits), 2%
// for conductivity and Prandtl number (White's stated accuracy of
// Sutherland's law for conductivity, +-2%).
func TestAirAgainstIncroperaA4(t *testing.T) {
	rows := []struct {
		T, rho, cp, mu, k, pr float64 // K, kg/m3, kJ/(kg K), 1e-7 N s/m2, 1e-3 W/(m K), -
	}{
		{250, 1.3947, 1.006, 159.6, 22.3, 0.720},
		{300, 1.1614, 1.007, 184.6, 26.3, 0.707},
		{350, 0.9950, 1.009, 208.2, 30.0, 0.700},
		{400, 0.8711, 1.014, 230.1, 33.8, 0.690},
		{450, 0.7740, 1.021, 250.7, 37.3, 0.686},
		{500, 0.6964, 1.030, 270.1, 40.7, 0.684},
		{550, 0.6329, 1.040, 288.4, 43.9, 0.683},
		{600, 0.5804, 1.051, 305.8, 46.9, 0.685},
	}
	for _, r := range rows {
		a := Properties(r.T, 1e5, nil)
		for _, c := range []struct {
			name      string
			got, want float64
			tol       float64
		}{
			{"rho", a.Rho, r.rho, 0.003},
			{"cp", a.Cp / 1000, r.cp, 0.015},
			{"mu", a.Mu * 1e7, r.mu, 0.015},
			{"k", a.K * 1e3, r.k, 0.02},
			{"Pr", a.Pr, r.pr, 0.02},
		} {
			if rel := math.Abs(c.got-c.want) / c.want; rel > c.tol {
				t.Errorf("T=%g K %s = %.5g, table %.5g (%.2f%%, tol %.1f%%)", r.T, c.name, c.got, c.want, 100*rel, 100*c.tol)
			}
		}
		if math.Abs(a.Nu-a.Mu/a.Rho) > 1e-18 || math.Abs(a.Alpha*a.Rho*a.Cp-a.K) > 1e-15 {
			t.Error("derived properties inconsistent")
		}
	}
}

func TestAirRangeWarning(t *testing.T) {
	var log validity.Log
	Properties(300, 101325, &log)
	if log.Len() != 0 {
		t.Fatal("warned in range")
	}
	Properties(1200, 101325, &log)
	Properties(150, 500, &log)
	if log.Len() != 2 {
		t.Fatalf("want 2 causes, got %d", log.Len())
	}
}

// ICAO Standard Atmosphere (Doc 7488, 3rd ed. 1993) / U.S. Standard
// Atmosphere 1976 tables (from memory): temperature, pressure and density
// at geopotential altitude. Tolerance 0.05%, the tables' printed digits.
func TestISA(t *testing.T) {
	rows := []struct{ z, T, p, rho float64 }{
		{0, 288.15, 101325, 1.2250},
		{1000, 281.65, 89874.6, 1.1117},
		{2000, 275.15, 79495.2, 1.0066},
		{3000, 268.65, 70108.5, 0.90925},
		{5000, 255.65, 54019.9, 0.73643},
		{11000, 216.65, 22632.1, 0.36392},
	}
	for _, r := range rows {
		a := ISA(r.z, nil)
		for _, c := range []struct {
			name      string
			got, want float64
		}{{"T", a.T, r.T}, {"p", a.P, r.p}, {"rho", a.Rho, r.rho}} {
			if rel := math.Abs(c.got-c.want) / c.want; rel > 5e-4 {
				t.Errorf("z=%g m %s = %.6g, table %.6g", r.z, c.name, c.got, c.want)
			}
		}
	}
	var log validity.Log
	ISA(15000, &log)
	if log.Len() != 1 {
		t.Error("no warning above the troposphere")
	}
}

// Pressure falls and density falls monotonically with altitude (property).
func TestISAMonotonic(t *testing.T) {
	prev := ISA(-500, nil)
	for z := -400.0; z <= 11000; z += 100 {
		a := ISA(z, nil)
		if !(a.P < prev.P && a.Rho < prev.Rho && a.T < prev.T) {
			t.Fatalf("not monotonic at %g m", z)
		}
		prev = a
	}
}

func BenchmarkProperties(b *testing.B) {
	b.ReportAllocs()
	s := 0.0
	for i := 0; i < b.N; i++ {
		s += Properties(300+float64(i&63), 95000, nil).Pr
	}
	_ = s
}
