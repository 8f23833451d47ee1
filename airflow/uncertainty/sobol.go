package uncertainty

import (
	"math/bits"
	"math/rand/v2"
)

// sobolDirections are the primitive polynomials and initial direction
// numbers of the first ten Sobol' coordinates after the first, from Joe &
// Kuo's table new-joe-kuo-6.21201 (Joe & Kuo, SIAM J. Sci. Comput. 30,
// 2008; from memory, checked by TestSobolNets): degree s, coefficients a,
// initial numbers m.
var sobolDirections = [dims - 1]struct {
	s, a uint
	m    []uint32
}{
	{1, 0, []uint32{1}},
	{2, 1, []uint32{1, 3}},
	{3, 1, []uint32{1, 3, 1}},
	{3, 2, []uint32{1, 1, 1}},
	{4, 1, []uint32{1, 1, 3, 3}},
	{4, 4, []uint32{1, 3, 5, 13}},
	{5, 2, []uint32{1, 1, 5, 5, 17}},
	{5, 4, []uint32{1, 1, 5, 5, 5}},
	{5, 7, []uint32{1, 1, 7, 11, 19}},
}

// sobol returns the first n points of the Sobol' sequence in [0, 1)^dims
// (Bratley & Fox's Gray-code construction, ACM TOMS 14, 1988), each
// coordinate given a random digital shift drawn from seed (an XOR that
// keeps the sequence's nets: Owen 1995's simplest randomisation).
func sobol(n int, seed uint64) [][dims]float64 {
	const bitsN = 32
	var v [dims][bitsN]uint32
	for i := 0; i < bitsN; i++ {
		v[0][i] = 1 << (31 - i)
	}
	for k, d := range sobolDirections {
		dv := &v[k+1]
		for i := uint(0); i < d.s; i++ {
			dv[i] = d.m[i] << (31 - i)
		}
		for i := d.s; i < bitsN; i++ {
			x := dv[i-d.s] ^ (dv[i-d.s] >> d.s)
			for j := uint(1); j < d.s; j++ {
				if (d.a>>(d.s-1-j))&1 == 1 {
					x ^= dv[i-j]
				}
			}
			dv[i] = x
		}
	}
	r := rand.New(rand.NewPCG(seed, 0x3c6ef372fe94f82b))
	var x, shift [dims]uint32
	for k := range shift {
		shift[k] = r.Uint32()
	}
	u := make([][dims]float64, n)
	for i := 0; i < n; i++ {
		for k := 0; k < dims; k++ {
			u[i][k] = float64(x[k]^shift[k]) / (1 << 32)
		}
		c := bits.TrailingZeros(uint(i + 1)) // the bit that changes in the Gray code
		for k := 0; k < dims; k++ {
			x[k] ^= v[k][c]
		}
	}
	return u
}
