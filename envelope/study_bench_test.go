package envelope

import "testing"

// Speed target (a benchmark, not a timed test): the scale study of six
// facilities × 40 scales on a 400×400 grid under 1 s on one core. Solving
// the grid once per scale would cost 240 solves; the study finds the best
// settings once per flight Mach number and compares each point with them
// per scale (study.go). Read the ratio to BenchmarkDemoSolve400 (the sum
// of its six facilities is one solve of each) in the same run:
//
//	go test -run '^$' -bench 'Study400|DemoSolve400' -cpu 1 ./envelope/

// benchStudy studies every facility of the demo on its 400×400 grid,
// without the demo's load data, or with load data on every facility when
// loads is set.
func benchStudy(b *testing.B, loads bool) {
	v, facs, s := demo400(b)
	v.Loads = ModelLoads{} // the demo's own load data (two balances) left out
	for k := range facs {
		facs[k].Balance = BalanceLimits{}
		if loads {
			facs[k].Balance = BalanceLimits{MaxNormalForce: 20e3}
		}
	}
	if loads {
		v.Loads = ModelLoads{CNMax: 1.2}
	}
	e, err := Evaluate(v, facs, s)
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	for b.Loop() {
		studies, errs := e.StudyAll(StudyOptions{Steps: DefaultStudySteps})
		for k, err := range errs {
			if err != nil {
				b.Fatal(err)
			}
			benchStudySink = studies[k]
		}
	}
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/1e6, "ms/study")
}

var benchStudySink *ScaleStudy

// BenchmarkStudy400 is the study of the six demo facilities (no load
// data: the scale-1 reaches serve every scale).
func BenchmarkStudy400(b *testing.B) { benchStudy(b, false) }

// BenchmarkStudy400Loads is the same with a balance on every facility:
// where the load cap can bind, the best settings are found again at each
// scale, and BalanceScaleEnvelope searches every point's scale window.
func BenchmarkStudy400Loads(b *testing.B) { benchStudy(b, true) }
