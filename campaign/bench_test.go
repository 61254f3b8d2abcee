package campaign

import (
	"os"
	"path/filepath"
	"runtime"
	"sync"
	"testing"

	"github.com/tracesift/tracesift/trace"
)

// BenchmarkDemoCampaign measures the whole demo campaign as
// `tracesift survey testdata/demo/campaign.csv` does: 36 traces of 4096
// samples, the 17 graph and increment metrics on each trace and on 19
// surrogates of each of shuffle, gauss and IAAFT (2088 feature vectors),
// the per-trace distributions, then every test. Traces are spread over
// GOMAXPROCS workers (set with -cpu). Run:
//
//	/usr/bin/time go test -run '^$' -bench DemoCampaign -benchtime 1x -cpu 2 ./campaign
func BenchmarkDemoCampaign(b *testing.B) {
	f, err := os.Open(filepath.Join(demoDir, "campaign.csv"))
	if err != nil {
		b.Fatal(err)
	}
	plan, err := ReadCSV(f, "campaign.csv", demoDir, Roles{})
	f.Close()
	if err != nil {
		b.Fatal(err)
	}
	series := make([][]float64, len(plan.Traces))
	for i, t := range plan.Traces {
		tr, err := trace.ReadFile(t.Path, trace.Options{})
		if err != nil {
			b.Fatal(err)
		}
		series[i] = tr.Values
	}
	b.ResetTimer()
	for range b.N {
		recs := make([]Record, len(series))
		next := make(chan int)
		var wg sync.WaitGroup
		for w := 0; w < runtime.GOMAXPROCS(0); w++ {
			wg.Go(func() {
				for i := range next {
					r, err := Measure(series[i], plan.Traces[i], MeasureOptions{Seed: 1})
					if err != nil {
						b.Error(err)
					}
					recs[i] = r
				}
			})
		}
		for i := range series {
			next <- i
		}
		close(next)
		wg.Wait()
		var rows []Row
		for _, r := range recs {
			rows = append(rows, Rows(r, plan.ParamName)...)
		}
		SortRows(rows)
		if _, err := Analyze(rows, AnalyzeOptions{}); err != nil {
			b.Fatal(err)
		}
	}
}
