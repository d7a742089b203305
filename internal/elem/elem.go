// Package elem provides the exponential, the natural logarithm, ln(1 + x)
// and the cube root for tripoint's equation evaluation: kernels faster
// than math.Exp, math.Log, math.Log1p and math.Cbrt on the hot paths of
// package helmholtz, within about 0.51 units in the last place (ulp) of
// the exact values. Log1p is fast only for |x| ≤ 2^-7 (the
// Planck–Einstein terms' ln(1 − e^(−θτ)) where θτ > 4.86) and is
// math.Log1p elsewhere.
//
// Exp and Log reduce the argument with a table of 128 entries and
// evaluate a short Taylor polynomial on the reduced argument, with the
// table values carried to double-double precision where the sum needs
// them. Arguments outside the ranges the kernels are built for (results
// that would overflow, underflow or be subnormal; zero, negative,
// subnormal, infinite or NaN arguments of Log) go to math.Exp and
// math.Log, so that every special case is theirs.
//
// Cbrt reduces its argument with a table of 192 entries (64 intervals of
// the mantissa times the three residues of the exponent modulo 3) and
// divides nowhere.
//
// Accuracy (TestKernelAccuracy, TestExpAgainstMath, TestLogAgainstMath,
// TestCbrtAgainstMath, TestLog1pAgainstMath): within 0.52 ulp of the
// exact values computed with math/big on a sample; within 1 ulp of
// math.Cbrt, math.Log1p and math.Log over their whole domains and
// of math.Exp over its whole domain, tested on millions of arguments,
// except for about one argument in 80 000 where math.Exp itself (on
// amd64 an assembly kernel) errs by more than 1 ulp, up to 1.65 ulp, and
// Exp lies 2 ulp from it.
package elem
