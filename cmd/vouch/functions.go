package main

import (
	"fmt"
	"io"
	"text/tabwriter"

	"github.com/vouchcalc/vouch/eval"
	"github.com/vouchcalc/vouch/props"
)

func cmdFunctions(args []string, stdout, stderr io.Writer) int {
	if len(args) > 0 {
		fmt.Fprintln(stderr, "usage: vouch functions (it takes no arguments)")
		return exitUsage
	}
	tw := tabwriter.NewWriter(stdout, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "function\targuments\twhat it gives\tvalidity")
	for _, f := range eval.Funcs() {
		fmt.Fprintf(tw, "%s\t(%s)\t%s\t%s\n", f.Name, f.Args, f.Doc, f.Range)
	}
	tw.Flush()
	fmt.Fprintln(stdout, "\nconstant: pi")
	fmt.Fprintf(stdout, "\nstate inputs, read from their dimensions: %v\n", props.Pairs)
	fmt.Fprintln(stdout, "\nfluids for fluid(NAME, A, B) and fluid_sat(NAME, X):")
	tw = tabwriter.NewWriter(stdout, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "fluid\talso\tequation of state\trange\treference state")
	for _, f := range props.Fluids() {
		fmt.Fprintf(tw, "%s\t%s\t%s\t%s\t%s\n", f.Name, f.Aliases, f.Equation, f.Range, f.Reference)
	}
	tw.Flush()
	return exitOK
}
