package kit

import (
	"fmt"
	"io"
	"os"
	"time"
)

// Progress reports the advance of a long run on one line: rewritten in
// place on a terminal, one line per stage elsewhere (a log file, a
// test). A nil *Progress reports nothing.
type Progress struct {
	w     io.Writer
	name  string
	tty   bool
	start time.Time
	stage string
	last  time.Time
}

// NewProgress returns a progress line for the program name on w; quiet
// or a nil w gives a Progress that reports nothing.
func NewProgress(w io.Writer, name string, quiet bool) *Progress {
	if quiet || w == nil {
		return nil
	}
	p := &Progress{w: w, name: name, start: time.Now()}
	if f, ok := w.(*os.File); ok {
		if fi, err := f.Stat(); err == nil && fi.Mode()&os.ModeCharDevice != 0 {
			p.tty = true
		}
	}
	return p
}

// Step reports item i of n of the current stage.
func (p *Progress) Step(stage string, i, n int) {
	if p == nil {
		return
	}
	if stage != p.stage {
		if p.stage != "" && p.tty {
			fmt.Fprintln(p.w)
		}
		p.stage = stage
		if !p.tty {
			fmt.Fprintf(p.w, "%s: %s (%d)\n", p.name, stage, n)
			return
		}
	}
	if p.tty && (time.Since(p.last) > 100*time.Millisecond || i == n) {
		p.last = time.Now()
		fmt.Fprintf(p.w, "\r%s: %s %d/%d", p.name, stage, i, n)
	}
}

// Done ends the progress line with the elapsed time.
func (p *Progress) Done() {
	if p == nil {
		return
	}
	if p.tty && p.stage != "" {
		fmt.Fprintln(p.w)
	}
	fmt.Fprintf(p.w, "%s: done in %.1f s\n", p.name, time.Since(p.start).Seconds())
}
