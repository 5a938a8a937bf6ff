package main

import (
	"fmt"
	"runtime"

	"github.com/spf13/cobra"
)

func newVersionCmd() *cobra.Command {
	return &cobra.Command{
		Use:   "version",
		Short: "Print the version of gapcert and of the Go toolchain it was built with",
		Long: `version prints the gapcert version, the Go version that built it and the
operating system and architecture it runs on. Certificates record the same
facts.`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			w := cmd.OutOrStdout()
			fmt.Fprintf(w, "gapcert %s\n", Version)
			fmt.Fprintf(w, "go:      %s\n", runtime.Version())
			fmt.Fprintf(w, "os/arch: %s/%s\n", runtime.GOOS, runtime.GOARCH)
			return nil
		},
	}
}
