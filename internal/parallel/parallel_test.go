package parallel

import "testing"

func TestForVisitsEveryIndexOnce(t *testing.T) {
	for _, workers := range []int{0, 1, 3, 64} {
		seen := make([]int, 1000)
		For(len(seen), workers, func(i int) { seen[i]++ })
		for i, c := range seen {
			if c != 1 {
				t.Fatalf("workers %d: index %d visited %d times", workers, i, c)
			}
		}
	}
	For(0, 2, func(int) { t.Fatal("called for n = 0") })
}
