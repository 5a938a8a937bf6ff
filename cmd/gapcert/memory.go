package main

import (
	"fmt"
	"math/big"
	"strings"

	"github.com/spf13/cobra"
)

// memoryLimitFlag is the value of --memory-limit: a size in bytes, 0 when
// not given (the certifier's default budget).
type memoryLimitFlag struct {
	text  string
	bytes int64
}

const memoryLimitUsage = "memory budget of one certification, e.g. 4GiB or 512MiB (units KiB, MiB, GiB, TiB; default 16GiB): a step whose estimated peak exceeds it is not started"

const verifyMemoryUsage = "memory budget of each recomputation, as for certify --memory-limit (e.g. 32GiB; default 16GiB): a certificate whose recipe needs more is refused before allocating"

func (m *memoryLimitFlag) register(cmd *cobra.Command, usage string) {
	cmd.Flags().StringVar(&m.text, "memory-limit", "", usage)
}

// memoryUnits are the binary units --memory-limit accepts (IEC 80000-13).
var memoryUnits = []struct {
	suffix string
	shift  uint
}{{"KiB", 10}, {"MiB", 20}, {"GiB", 30}, {"TiB", 40}}

// minMemoryLimit and maxMemoryLimit bound --memory-limit: below 16 MiB no
// first step fits, and 1 PiB keeps the byte count far inside int64.
const (
	minMemoryLimit = 16 << 20
	maxMemoryLimit = 1 << 50
)

// parse sets m.bytes from m.text: a decimal number (digits, at most one
// point) followed by a binary unit, or a whole number of bytes. It is
// parsed exactly (math/big) and rounded down to whole bytes.
func (m *memoryLimitFlag) parse() error {
	if m.text == "" {
		return nil
	}
	number, shift := m.text, uint(0)
	for _, u := range memoryUnits {
		if strings.HasSuffix(m.text, u.suffix) {
			number, shift = strings.TrimSuffix(m.text, u.suffix), u.shift
			break
		}
	}
	hint := "(hint: --memory-limit 4GiB; units KiB, MiB, GiB, TiB)"
	if number == "" || strings.Trim(number, "0123456789.") != "" || strings.Count(number, ".") > 1 ||
		strings.HasPrefix(number, ".") || strings.HasSuffix(number, ".") {
		return fmt.Errorf("--memory-limit %q: want a number and a unit %s", m.text, hint)
	}
	if shift == 0 && strings.Contains(number, ".") {
		return fmt.Errorf("--memory-limit %q: a number of bytes must be whole %s", m.text, hint)
	}
	r, ok := new(big.Rat).SetString(number)
	if !ok {
		return fmt.Errorf("--memory-limit %q: want a number and a unit %s", m.text, hint)
	}
	r.Mul(r, new(big.Rat).SetInt(new(big.Int).Lsh(big.NewInt(1), shift)))
	b := new(big.Int).Quo(r.Num(), r.Denom())
	switch {
	case b.Cmp(big.NewInt(minMemoryLimit)) < 0:
		return fmt.Errorf("--memory-limit %q: below 16MiB no computation fits %s", m.text, hint)
	case b.Cmp(big.NewInt(maxMemoryLimit)) > 0:
		return fmt.Errorf("--memory-limit %q: above the largest budget, 1024TiB %s", m.text, hint)
	}
	m.bytes = b.Int64()
	return nil
}
