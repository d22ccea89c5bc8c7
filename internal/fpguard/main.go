// Command fpguard rewrites the module's Go source so that its floating-point
// results are the same bits on every architecture.
//
// Two things make float64 results depend on the machine:
//
//   - The Go spec lets a compiler fuse x*y + z into one fused multiply-add
//     (one rounding instead of two), even across statements; the arm64
//     compiler does. An explicit conversion float64(x*y) forces the product
//     to be rounded and so prevents the fusion.
//   - math.Exp, math.Log and math.Exp2 have assembly on some architectures,
//     and the pure-Go functions of package math are themselves compiled
//     with fusion on arm64. internal/fpmath holds guarded pure-Go copies.
//
// fpguard therefore, in every non-test file of the packages it is given:
//
//   - wraps each non-constant floating-point product a*b in a conversion to
//     its own type, float64(a*b), unless it is already so wrapped or its
//     only consumer is another multiplication or a division (a product
//     cannot fuse with a product or a quotient);
//   - rewrites x *= y as x = float64(x * y) (or x * (y) when y is an
//     expression);
//   - replaces calls and uses of the inexact functions of package math
//     (math.Exp, math.Log, math.Pow, ...) by their internal/fpmath copies,
//     fixing the file's imports.
//
// The rewrite is idempotent: a second run changes nothing. With -check it
// changes nothing and lists what it would change, exiting 1 if anything.
//
// Usage, from anywhere inside the module:
//
//	go run ./internal/fpguard [-check] [dir ...]
//
// Without dirs it rewrites every package below the current directory (go
// list ./...): run it from the module root.
package main

import (
	"flag"
	"fmt"
	"os"
)

func main() {
	check := flag.Bool("check", false, "change nothing; list the files that need guarding and exit 1 if any")
	flag.Usage = func() {
		fmt.Fprintln(os.Stderr, "usage: go run ./internal/fpguard [-check] [dir ...]")
		flag.PrintDefaults()
	}
	flag.Parse()
	res, err := Run(flag.Args(), !*check)
	if err != nil {
		fmt.Fprintln(os.Stderr, "fpguard:", err)
		os.Exit(2)
	}
	for _, f := range res.Changed {
		if *check {
			fmt.Printf("%s: needs guarding (%d edits)\n", f.Path, f.Edits)
		} else {
			fmt.Printf("%s: %d edits\n", f.Path, f.Edits)
		}
	}
	if *check && len(res.Changed) > 0 {
		os.Exit(1)
	}
}
