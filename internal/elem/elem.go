// Package elem provides the exponential and the natural logarithm for
// tripoint's equation evaluation: table-driven kernels, faster than
// math.Exp and math.Log on the hot paths of package helmholtz, within
// about 0.51 units in the last place (ulp) of the exact values.
//
// Both kernels reduce the argument with a table of 128 entries and
// evaluate a short Taylor polynomial on the reduced argument, with the
// table values carried to double-double precision where the sum needs
// them. Arguments outside the ranges the kernels are built for (results
// that would overflow, underflow or be subnormal; zero, negative,
// subnormal, infinite or NaN arguments of Log) go to math.Exp and
// math.Log, so that every special case is theirs.
//
// Accuracy (TestExpAccuracy, TestLogAccuracy, TestExpAgainstMath,
// TestLogAgainstMath): within 0.51 ulp of the exact values computed with
// math/big on a sample; within 1 ulp of math.Log over its whole domain and
// of math.Exp over its whole domain, tested on millions of arguments,
// except for about one argument in 80 000 where math.Exp itself (on
// amd64 an assembly kernel) errs by more than 1 ulp, up to 1.65 ulp, and
// Exp lies 2 ulp from it.
package elem
