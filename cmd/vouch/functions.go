package main

import (
	"fmt"
	"io"
	"text/tabwriter"

	"vouch/eval"
)

func cmdFunctions(_ []string, stdout, _ io.Writer) int {
	tw := tabwriter.NewWriter(stdout, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "function\targuments\twhat it gives\tvalidity")
	for _, f := range eval.Funcs() {
		fmt.Fprintf(tw, "%s\t(%s)\t%s\t%s\n", f.Name, f.Args, f.Doc, f.Range)
	}
	tw.Flush()
	fmt.Fprintln(stdout, "\nconstant: pi")
	return exitOK
}
