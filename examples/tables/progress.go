package main

import (
	"fmt"
	"io"
	"strings"
	"time"
)

// progress prints a progress line to w (stderr) for a run that lasts: the
// first after one second, then at most four a second, each overwriting
// the last with a carriage return, and a final line with a newline when
// the run ends. Short runs print nothing.
type progress struct {
	w           io.Writer // nil: silent
	label       string
	total, done int
	start, last time.Time
	shown       bool
	lastLen     int // length of the last line shown
	now         func() time.Time
}

const (
	progressDelay = time.Second
	progressEvery = 250 * time.Millisecond
)

func newProgress(w io.Writer, label string, total int, now func() time.Time) *progress {
	if now == nil {
		now = time.Now
	}
	return &progress{w: w, label: label, total: total, now: now, start: now()}
}

// step records one more finished row.
func (p *progress) step() {
	p.done++
	if p.w == nil {
		return
	}
	t := p.now()
	if t.Sub(p.start) < progressDelay || p.shown && t.Sub(p.last) < progressEvery {
		return
	}
	p.last, p.shown = t, true
	line := fmt.Sprintf("%s: %d of %d rows (%.0f%%), %.1f s", p.label, p.done, p.total,
		100*float64(p.done)/float64(max(p.total, 1)), t.Sub(p.start).Seconds())
	p.lastLen = len(line)
	fmt.Fprint(p.w, "\r"+line)
}

// end finishes the progress line, if one was shown.
func (p *progress) end() {
	if p.w == nil || !p.shown {
		return
	}
	line := fmt.Sprintf("%s: %d of %d rows, %.1f s", p.label, p.done, p.total, p.now().Sub(p.start).Seconds())
	// Spaces clear the rest of the longer line before it.
	fmt.Fprint(p.w, "\r"+line+strings.Repeat(" ", max(0, p.lastLen-len(line)))+"\n")
}
