package fluid

import (
	"bytes"
	"flag"
	"os"
	"testing"

	"github.com/tripoint-thermo/tripoint/helmholtz"
)

var regenKernels = flag.Bool("regen", false, "write the kernels *_kernel.go from the residual terms")

// kernels are the generated kernel files and the terms they come from.
var kernels = []struct {
	file, name string
	terms      helmholtz.ResidualTerms
}{
	{"co2_kernel.go", "co2Kernel", co2Residual},
	{"water_kernel.go", "waterKernel", waterResidual},
	{"r134a_kernel.go", "r134aKernel", r134aResidual},
}

// TestKernelsCurrent generates every fluid's kernel from its terms again
// and compares it with the file (with -regen, writes the file): a kernel
// is never older than its coefficients. (WithKernel also refuses a kernel
// whose fingerprint is not its terms', and TestEvaluationReference proves
// the evaluation with the kernels against the term-by-term one.)
func TestKernelsCurrent(t *testing.T) {
	for _, k := range kernels {
		var b bytes.Buffer
		if err := helmholtz.MustNewResidual(k.terms).WriteKernel(&b, "fluid", k.name); err != nil {
			t.Fatal(err)
		}
		if *regenKernels {
			if err := os.WriteFile(k.file, b.Bytes(), 0o644); err != nil {
				t.Fatal(err)
			}
			continue
		}
		got, err := os.ReadFile(k.file)
		if err != nil {
			t.Fatal(err)
		}
		if !bytes.Equal(got, b.Bytes()) {
			t.Errorf("%s differs from the kernel of its terms: go test ./fluid -run TestKernelsCurrent -regen", k.file)
		}
	}
}
