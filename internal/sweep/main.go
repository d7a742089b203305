package main

import (
	"flag"
	"fmt"
	"io"
	"os"
	"runtime"
	"sort"
	"strings"
	"sync"
	"sync/atomic"
	"time"

	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/fluid"
)

// config is what the flags set.
type config struct {
	fluids   []string
	states   float64
	workers  int
	regions  [nRegions]bool
	show     int
	progress bool
}

func main() {
	cfg, err := parseFlags(os.Args[1:], os.Stderr)
	if err != nil {
		if err == flag.ErrHelp {
			return
		}
		fmt.Fprintln(os.Stderr, "sweep:", err)
		os.Exit(2)
	}
	failed := false
	for _, name := range cfg.fluids {
		f, err := fluid.Lookup(name)
		if err != nil {
			fmt.Fprintln(os.Stderr, "sweep:", err)
			os.Exit(2)
		}
		rep, err := sweep(f, cfg, os.Stderr)
		if err != nil {
			fmt.Fprintln(os.Stderr, "sweep:", err)
			os.Exit(1)
		}
		rep.print(os.Stdout, cfg.show)
		failed = failed || rep.res.total() > 0
	}
	if failed {
		os.Exit(1)
	}
}

func parseFlags(args []string, stderr io.Writer) (*config, error) {
	fs := flag.NewFlagSet("sweep", flag.ContinueOnError)
	fs.SetOutput(stderr)
	fl := fs.String("fluid", "all", "the fluid to sweep: a name fluid.Lookup knows (CO2, water, R134a, ...) or \"all\"")
	n := fs.Float64("states", 1e6, "about how many forward states per fluid, shared among the regions")
	w := fs.Int("workers", runtime.GOMAXPROCS(0), "goroutines that run the cases (the results do not depend on it)")
	rg := fs.String("regions", "all", "comma-separated regions to sweep: "+strings.Join(regionNames[:], ", ")+", or \"all\"")
	show := fs.Int("show", 10, "failures to print of each kind")
	quiet := fs.Bool("quiet", false, "no progress line on standard error")
	fs.Usage = func() {
		fmt.Fprintf(stderr, `Usage: go run ./internal/sweep [flags]

Runs every flash over dense grids of states through every region of a
fluid and reports failures, the worst round-trip residuals (in units of
the backward-residual bounds of the design), the worst consistency
errors, the states per region and phase, and the time. It exits with
status 1 if anything failed. See the package doc (go doc ./internal/sweep)
for what is checked.

Flags:
`)
		fs.PrintDefaults()
	}
	if err := fs.Parse(args); err != nil {
		return nil, err
	}
	if fs.NArg() > 0 {
		return nil, fmt.Errorf("unexpected arguments %q (see -h)", fs.Args())
	}
	cfg := &config{states: *n, workers: *w, show: *show, progress: !*quiet}
	if !(cfg.states >= 1 && cfg.states <= 1e9) {
		return nil, fmt.Errorf("-states %v: want 1 to 1e9", *n)
	}
	if cfg.workers < 1 {
		return nil, fmt.Errorf("-workers %d: want at least 1", *w)
	}
	if *fl == "all" {
		cfg.fluids = fluid.Names()
	} else {
		f, err := fluid.Lookup(*fl)
		if err != nil {
			return nil, err
		}
		cfg.fluids = []string{f.Name()}
	}
	if *rg == "all" {
		for i := range cfg.regions {
			cfg.regions[i] = true
		}
	} else {
		for _, name := range strings.Split(*rg, ",") {
			i := indexOf(strings.TrimSpace(name))
			if i < 0 {
				return nil, fmt.Errorf("-regions: unknown region %q; known: %s", name, strings.Join(regionNames[:], ", "))
			}
			cfg.regions[i] = true
		}
	}
	return cfg, nil
}

func indexOf(name string) int {
	for i, n := range regionNames {
		if n == name {
			return i
		}
	}
	return -1
}

// report is the outcome of the sweep of one fluid.
type report struct {
	fluid   string
	res     *result
	elapsed time.Duration
	workers int
}

// chunk is the number of cases a goroutine takes at a time.
const chunk = 256

// sweep runs the cases of f on cfg.workers goroutines. Each chunk of
// cases has its own result; the chunks are merged in order.
func sweep(f *fluid.Fluid, cfg *config, progress io.Writer) (*report, error) {
	t0 := time.Now()
	s, err := newSetup(f)
	if err != nil {
		return nil, err
	}
	cs := s.cases(cfg.states, cfg.regions)
	nChunks := (len(cs) + chunk - 1) / chunk
	parts := make([]*result, nChunks)
	var next, done atomic.Int64
	var wg sync.WaitGroup
	for range cfg.workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for {
				i := int(next.Add(1) - 1)
				if i >= nChunks {
					return
				}
				r := newResult(f.Name(), cfg.show)
				for j := i * chunk; j < min((i+1)*chunk, len(cs)); j++ {
					s.runCase(&cs[j], r)
				}
				parts[i] = r
				done.Add(1)
			}
		}()
	}
	stop := make(chan struct{})
	var pw sync.WaitGroup
	if cfg.progress && progress != nil {
		pw.Add(1)
		go func() {
			defer pw.Done()
			tick := time.NewTicker(5 * time.Second)
			defer tick.Stop()
			for {
				select {
				case <-stop:
					fmt.Fprintf(progress, "\r%-70s\r", "")
					return
				case <-tick.C:
					d := done.Load()
					el := time.Since(t0)
					eta := time.Duration(float64(el) * float64(int64(nChunks)-d) / float64(max(d, 1)))
					fmt.Fprintf(progress, "\r%s: %d of %d cases, %s, about %s left   ", f.Name(),
						min(int(d)*chunk, len(cs)), len(cs), el.Round(time.Second), eta.Round(time.Second))
				}
			}
		}()
	}
	wg.Wait()
	close(stop)
	pw.Wait()
	total := newResult(f.Name(), cfg.show)
	for _, p := range parts {
		total.merge(p)
	}
	return &report{fluid: f.Name(), res: total, elapsed: time.Since(t0), workers: cfg.workers}, nil
}

func (r *result) total() int {
	n := 0
	for _, v := range r.fails {
		n += v
	}
	return n
}

// print writes the report.
func (rp *report) print(w io.Writer, show int) {
	r := rp.res
	states := 0
	for _, v := range r.states {
		states += v
	}
	fmt.Fprintf(w, "sweep %s: %d cases, %d states, %d flashes in %.1f s on %d goroutines\n",
		rp.fluid, r.cases, states, r.flashes, rp.elapsed.Seconds(), rp.workers)
	fmt.Fprintf(w, "failures: %d", r.total())
	for k := range r.fails {
		fmt.Fprintf(w, ", %s %d", failNames[k], r.fails[k])
	}
	fmt.Fprintln(w)
	fmt.Fprintf(w, "\n%-14s %9s %9s  %s\n", "region", "states", "refused", "phases of the forward states")
	for i := range nRegions {
		if r.states[i] == 0 && r.refusedOK[i] == 0 {
			continue
		}
		var ph []string
		for p, n := range r.byPhase[i] {
			if n > 0 {
				ph = append(ph, fmt.Sprintf("%v %d", flash.Phase(p), n))
			}
		}
		fmt.Fprintf(w, "%-14s %9d %9d  %s\n", regionNames[i], r.states[i], r.refusedOK[i], strings.Join(ph, ", "))
	}
	if len(r.errSeen) > 0 {
		var keys []string
		for k := range r.errSeen {
			keys = append(keys, k)
		}
		sort.Strings(keys)
		fmt.Fprintf(w, "refusals the judge allowed or asked for:")
		for _, k := range keys {
			fmt.Fprintf(w, " %s %d;", k, r.errSeen[k])
		}
		fmt.Fprintln(w)
	}
	fmt.Fprintf(w, "\nworst backward residual / bound (1 = at the bound of DESIGN.md), by flash and input:\n")
	for i := range inverses {
		line := ""
		for q := range nQuantities {
			if x := &r.resid[i][q]; x.n > 0 {
				line += fmt.Sprintf("  %s %.3g (n %d)", quantityNames[q], x.v, x.n)
			}
		}
		if line != "" {
			fmt.Fprintf(w, "  %-3s%s\n", inverses[i].name, line)
		}
	}
	fmt.Fprintf(w, "  the worst of them: ")
	var wi int
	var wq quantity
	for i := range inverses {
		for q := range nQuantities {
			if r.resid[i][q].v > r.resid[wi][wq].v {
				wi, wq = i, q
			}
		}
	}
	fmt.Fprintf(w, "%s %s %.3g at %s\n", inverses[wi].name, quantityNames[wq], r.resid[wi][wq].v, r.resid[wi][wq].where)
	fmt.Fprintf(w, "\nworst consistency errors (bound in brackets; %d difference checks skipped near the critical point or at a range edge):\n", r.skipped)
	for m := range nMeasures {
		x := &r.cons[m]
		if x.n == 0 {
			continue
		}
		fmt.Fprintf(w, "  %-66s %9.3g [%.0e] n %d\n", measureNames[m], x.v, measureBounds[m], x.n)
		if x.v > measureBounds[m] || x.v > 0.1*measureBounds[m] {
			fmt.Fprintf(w, "      at %s\n", x.where)
		}
	}
	if r.total() > 0 {
		fmt.Fprintf(w, "\nfailures (the first %d of each kind; f is fluid.Lookup(%q)):\n", show, rp.fluid)
		for k := range r.first {
			for _, fl := range r.first[k] {
				fmt.Fprintf(w, "  [%s] %s\n", failNames[k], fl.text)
			}
		}
	}
	fmt.Fprintln(w)
}
