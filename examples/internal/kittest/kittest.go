// Package kittest holds the test helpers tripoint's example programs
// share.
package kittest

import (
	"errors"
	"flag"
	"io"
	"strings"
	"testing"
)

// BadFlag is a command line the program must refuse, and a word its
// message must contain (the flag's name, say).
type BadFlag struct {
	Args []string
	Want string
}

// CheckCommandLine checks a program's run function: each bad command
// line gives an error (not flag.ErrHelp) whose text or the program's
// error output contains its word, and -h returns flag.ErrHelp and prints
// every word of help.
func CheckCommandLine(t *testing.T, run func(args []string, stdout, stderr io.Writer) error, bad []BadFlag, help []string) {
	t.Helper()
	for _, tc := range bad {
		var errs strings.Builder
		err := run(tc.Args, io.Discard, &errs)
		if err == nil || errors.Is(err, flag.ErrHelp) {
			t.Errorf("%v: error %v", tc.Args, err)
			continue
		}
		if msg := errs.String() + err.Error(); !strings.Contains(msg, tc.Want) {
			t.Errorf("%v: message %q does not name %q", tc.Args, msg, tc.Want)
		}
	}
	var errs strings.Builder
	if err := run([]string{"-h"}, io.Discard, &errs); !errors.Is(err, flag.ErrHelp) {
		t.Errorf("-h: %v", err)
	}
	for _, w := range help {
		if !strings.Contains(errs.String(), w) {
			t.Errorf("-h lacks %q", w)
		}
	}
}
