// Package fpmath holds pure-Go copies of the inexact functions of package
// math (Exp, Log, Pow, Log10, the trigonometric functions, ...) that give
// the same bits on every architecture.
//
// Package math has assembly for Exp, Exp2, Log and Hypot on some
// architectures (amd64's Exp uses fused multiply-add when the CPU has it),
// and its pure-Go functions are compiled with fused multiply-add on arm64,
// so its results differ in the last bits between machines. These copies
// are Go's own pure-Go implementations (BSD licence, see LICENSE and the
// notice at the top of each file), with every product rounded explicitly
// by internal/fpguard so that no compiler may fuse it with an addition.
//
// The exact functions of package math (Sqrt, Abs, Floor, Frexp, Ldexp,
// Modf, ...) give the same bits everywhere and are used directly.
//
// The package imports only math and math/bits; vouch's numeric packages
// call it instead of math for every inexact function (held by
// internal/fpguard's TestModuleGuarded).
package fpmath
