package table

//go:noescape
func evalVec(wx, wy *[4]float64, d0, d1 *float64, e0, e1 *float32, out *[maxProps]float64)

func cpuid(leaf, sub uint32) (a, b, c, d uint32)

func xgetbv() (eax uint32)

// vector reports whether the processor and the operating system support
// the AVX and FMA instructions of evalVec (CPUID leaf 1: FMA, OSXSAVE,
// AVX; XCR0: the XMM and YMM state enabled).
var vector = func() bool {
	n, _, _, _ := cpuid(0, 0)
	if n < 1 {
		return false
	}
	_, _, c, _ := cpuid(1, 0)
	const fma, osxsave, avx = 1 << 12, 1 << 27, 1 << 28
	if c&fma == 0 || c&osxsave == 0 || c&avx == 0 {
		return false
	}
	return xgetbv()&6 == 6
}()
