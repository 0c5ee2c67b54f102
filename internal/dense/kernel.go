package dense

// kern6x8go is the portable micro-kernel, the reference loop
//
//	for p := 0; p < k; p++ { for i := 0; i < 6; i++ { for j := 0; j < 8; j++ {
//		c[i*ldc+j] += a[6p+i] * b[ldb·p+j] } } }
//
// computed two rows at a time in registers.
func kern6x8go(k int, a, b []float64, ldb int, c []float64, ldc int) {
	for i := 0; i < 6; i += 2 {
		var r0, r1 [8]float64
		for p := 0; p < k; p++ {
			bp := b[ldb*p : ldb*p+8 : ldb*p+8]
			x0, x1 := a[6*p+i], a[6*p+i+1]
			for j, bj := range bp {
				r0[j] += x0 * bj
				r1[j] += x1 * bj
			}
		}
		c0 := c[i*ldc : i*ldc+8]
		c1 := c[(i+1)*ldc : (i+1)*ldc+8]
		for j := range 8 {
			c0[j] += r0[j]
			c1[j] += r1[j]
		}
	}
}
