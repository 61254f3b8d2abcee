package groups

import (
	"math"
	"math/rand/v2"
	"testing"
)

// The literals below were printed by scripts/goldens/campaign_stats.py
// with SciPy 1.10.1 and NumPy 1.24.2 (Debian's python3-scipy; run with
// /usr/bin/python3): scipy.stats.wilcoxon (exact and approx, zero_method
// "wilcox", no continuity correction), scipy.stats.spearmanr and
// scipy.stats.theilslopes(y, x, alpha=0.95). Rerun the script and paste its
// output to refresh them.

type signedRankCase struct {
	name             string
	d                []float64
	exact            *[2]float64 // statistic, p; nil when SciPy's exact mode does not apply (ties or zeros)
	approxT, approxP float64
}

type trendCase struct {
	name                        string
	x, y                        []float64
	rho, p                      float64
	slope, intercept, low, high float64
}

var signedRankGolden = []signedRankCase{
	{name: "normal_6", d: []float64{-1.3415764609567975, 0.0992211545182835, 0.6642538518861472, 2.3605583194281583, 1.4799716540860215, 1.315881384727475}, exact: &[2]float64{4.0, 0.21875}, approxT: 4.0, approxP: 0.17295491798842066},
	{name: "normal_6_null", d: []float64{-0.12259960260274212, 0.9512958560572903, -0.32095333405511944, -0.19553495226865983, -1.8773395783134565, -0.7464081001311867}, exact: &[2]float64{5.0, 0.3125}, approxT: 5.0, approxP: 0.24886387493792206},
	{name: "normal_10", d: []float64{1.0634306260916908, 1.73852737559536, -0.29017760015234517, 0.29605187088261686, -0.4724750089062658, 1.829481337440236, 1.073762502685095, 1.1584229205083612, 0.5452110438755831, -1.3302544245320738}, exact: &[2]float64{12.0, 0.130859375}, approxT: 12.0, approxP: 0.11412832776223863},
	{name: "normal_20", d: []float64{0.2509222793645331, 0.04283490649848326, -0.8092618245656276, 0.9155511644974841, -0.17631820121741537, 0.6522205978636726, 0.13039610008390903, 0.3123116557995086, 1.3539735500438397, -0.10659182567918185, -0.10853850130258624, 0.48699913598746536, 0.06148151110699057, 0.11749664500612922, -0.7997073425235082, 1.9002360500695719, -0.929908489550078, -0.09812101330761502, 1.6564518662886178, 0.0013163480289029583}, exact: &[2]float64{70.0, 0.20244979858398438}, approxT: 70.0, approxP: 0.1913338368695522},
	{name: "normal_35", d: []float64{0.13395184201255783, 0.14852326537553195, 1.3286528051028155, -0.8601875181690255, -0.563858667069272, -0.32532511249565765, -1.401171838432525, 1.136574525625237, -0.6728186385917697, 0.7585559492283439, -1.30607311123774, 2.060144915857281, 2.0908579465491868, -1.3639876263439161, -1.7882756306464946, -0.15911858196732426, 0.07879737941157838, 0.6780366160349603, 0.3077399280577918, 0.3247015878795655, -0.02019122452327149, 0.05668975682074745, -1.0744801013605896, -0.10404596355864665, -0.08170556762636466, -0.19474000012708273, 0.4057676352575317, -0.4862749786027415, -1.3698202814576654, -0.5351038440512844, 0.7640898729668627, -0.8018429721841087, 0.06386824707346489, 0.273443473119225, 0.514916601589634}, exact: &[2]float64{283.0, 0.6101043444359675}, approxT: 283.0, approxP: 0.6001863328603723},
	{name: "normal_50", d: []float64{-1.1866044833435339, -0.33671327124644085, -0.03931067233101221, -1.706868960566816, 0.9078166568450905, -0.1915668194267427, 0.44641610629918643, -1.64600233446793, 1.9478042033838887, -1.713506277592101, -0.8353729623664843, -0.7388452673730126, 0.6557370604407512, -0.9876886060192009, 0.32838844704249776, -0.6224146308747254, -1.5527178628953748, 2.551075680497931, 0.9676617802792433, 0.530660970786025, -0.061742459829778384, -0.1044169680404452, 1.11149267428394, -1.154227869454662, 1.5583700437981092, -0.24408326950200943, -1.8685355704583986, -1.513758786741221, 0.4099931759251323, -1.3243814676732895, -0.8135404875223384, -0.17506213808640297, -0.2616154352361145, -0.4152486230362718, 1.137492789838407, 1.4068085242480435, -0.41930639715638945, 0.20252130546732885, 1.0416377273879873, -0.8214794616168541, -0.5469250411883797, 1.1342225667156043, -2.4168039979803906, 1.2319322194289328, 1.6022247553114946, 1.2104257174128739, 1.5057781979672873, -1.0432277808184744, 0.7042144772698518, 0.39231568063219546}, exact: &[2]float64{611.0, 0.8035269768960163}, approxT: 611.0, approxP: 0.7980960963894896},
	{name: "normal_60", d: []float64{0.48088813439028816, 0.3905954712940527, -1.1934016988038303, -1.1461636121936767, 0.9598418132445152, -0.317853803586985, 1.292237992992092, -0.9704769519021883, -0.3773771996710682, -1.3032059768216107, -1.076366241786501, -0.5362508702420103, -0.8322726168552985, 0.32094274197363115, 0.5317873638144895, -0.4499142472764982, 0.5657037547464453, 0.9119050595481232, -0.2863931175604978, -1.8690258831588507, -1.2434840956378108, -0.436785710558274, 2.0958766225061165, -0.5252209730824289, 1.214070453645944, 0.4881661498597903, -0.6503237280572338, 0.24518115443485125, 1.6033125798603425, 2.454972626891345, 1.15953782479012, 0.2575109506847355, 2.2233693108210115, -0.733157248710626, 0.9695513559410922, 1.9718188789337252, -0.41106773115982076, 1.4030695500048251, -0.80900490936256, -0.5683979688617267, 0.8896407438671764, -0.9955005398513592, -1.3587450479377199, 1.3382339513873556, -0.6010642986337225, -0.3008234292866415, 0.20674274249623809, 2.895482613027405, 0.6746686129034973, 1.1802007356128619, 0.3179967420798857, 0.606378739319847, -0.9733915172321943, 0.5645074501701066, 0.5323440653081464, -0.11400688947304666, 0.43429947704964605, 0.8554554306570729, 0.7859151655016647, 1.0077724386481008}, exact: nil, approxT: 730.0, approxP: 0.17323053346463668},
	{name: "all_positive_6", d: []float64{0.08544057562787408, 0.7945552118146977, 0.6714883495151918, 0.1667686615027806, 1.383175939812735, 0.5077074774448733}, exact: &[2]float64{0.0, 0.03125}, approxT: 0.0, approxP: 0.027707849358079864},
	{name: "ties_25", d: []float64{-2.75, 0.75, -1.25, -0.75, 1.25, 1.75, 1.75, 0.25, 1.25, 2.25, 0.75, -0.75, 2.25, 0.75, -1.75, -1.75, 1.25, 2.25, 2.25, 2.25, 0.75, -0.75, -0.25, 1.25, 3.25}, exact: nil, approxT: 88.5, approxP: 0.045411546082729744},
	{name: "zeros_15", d: []float64{2.0, 1.0, -1.0, -2.0, -1.0, 1.0, 1.0, 0.0, 2.0, 0.0, 0.0, 0.0, -1.0, 1.0, 2.0}, exact: nil, approxT: 21.5, approxP: 0.29026469528738685},
	{name: "ties_sign_12", d: []float64{1.0, -1.0, 2.0, 2.0, -2.0, 3.0, 3.0, 3.0, -0.5, 4.0, 5.0, -5.0}, exact: nil, approxT: 20.0, approxP: 0.13458889999012513},
}

var trendGolden = []trendCase{
	{name: "levels_rising", x: []float64{0.6, 0.6, 0.6, 0.6, 0.6, 0.6, 0.9, 0.9, 0.9, 0.9, 0.9, 0.9, 1.2, 1.2, 1.2, 1.2, 1.2, 1.2}, y: []float64{3.0303281180080255, 2.410790462403033, 3.0095949372556565, 3.2226118340860657, 2.6823846600099035, 2.6829794884057274, 3.9328270407813846, 3.8031527786012598, 3.5325005167096375, 3.0303529815977823, 3.4371694554154573, 3.7497001884102845, 3.9679372690456516, 4.1584076866746615, 3.885652108735092, 3.6414212922388316, 3.8289432286891443, 4.393602020875988}, rho: 0.8655784229010971, p: 3.4856574718043534e-06, slope: 1.9128094317485382, intercept: 1.8654324159005502, low: 1.1841830269113396, high: 2.515949318018512},
	{name: "levels_null", x: []float64{0.6, 0.6, 0.6, 0.6, 0.6, 0.6, 0.9, 0.9, 0.9, 0.9, 0.9, 0.9, 1.2, 1.2, 1.2, 1.2, 1.2, 1.2}, y: []float64{0.4484445804726312, 0.6158278641826397, 0.4222103076398673, -1.181117457687086, 1.3168777981742168, -0.7139060949492252, 0.7937940431239118, 1.0011634033824306, 2.348063611054335, 0.5464831793890972, -0.22091074122630217, 0.5113729850903945, -1.1482458947499237, -0.9920941645258256, -1.1536383515542705, -1.0235414789047104, 1.199783147714711, 0.6681510313707603}, rho: -0.13114824589410562, p: 0.6039567557369119, slope: -0.6199793197968198, intercept: 1.0378901705986507, low: -2.949110359561517, high: 1.2522309454034664},
	{name: "levels_falling_ties", x: []float64{0.6, 0.6, 0.6, 0.6, 0.6, 0.6, 0.9, 0.9, 0.9, 0.9, 0.9, 0.9, 1.2, 1.2, 1.2, 1.2, 1.2, 1.2}, y: []float64{1.7, 1.2, 1.7, 1.9, 2.1, 2.0, 0.9, 0.9, 1.1, 1.5, 1.8, 0.8, 0.7, 0.8, 0.7, 0.5, 0.4, 0.9}, rho: -0.862140682131725, p: 4.217973745787172e-06, slope: -1.9166666666666665, intercept: 2.7249999999999996, low: -2.666666666666666, high: -1.0000000000000004},
	{name: "index_25", x: []float64{0.0, 1.0, 2.0, 3.0, 4.0, 5.0, 6.0, 7.0, 8.0, 9.0, 10.0, 11.0, 12.0, 13.0, 14.0, 15.0, 16.0, 17.0, 18.0, 19.0, 20.0, 21.0, 22.0, 23.0, 24.0}, y: []float64{-0.44009691915319304, -0.3052913718260248, -0.8105283266857682, 0.47152350716115016, -0.20677557568057736, -3.5652972474750992, 3.1209460165970575, 4.457606519274101, -1.7618268316705765, 2.418017884287833, 3.0121643157448816, 1.7205851915165908, 2.1382370858194992, 7.667937477190936, 2.590491710600579, 3.3449523288014342, 4.2330193528045115, 11.260558576201802, 4.368131309848282, 4.881059269286625, 11.116792164033356, 7.379746892280867, 3.3570174167814453, 8.301782904617422, 8.001595825286053}, rho: 0.8146153846153847, p: 7.17536501157323e-07, slope: 0.3723060221150373, intercept: -1.3467262487833902, low: 0.26073169290196135, high: 0.5411104114685473},
	{name: "uniform_40", x: []float64{9.82265567629476, 9.882785783852176, 5.810570354357712, 8.547284043313438, 4.939275486740336, 5.966443494100567, 4.78439940603045, 8.498075726394603, 4.842233244159199, 3.3222813470108967, 6.509105315679562, 0.794724659490107, 9.022285924472012, 7.083523846637244, 8.499337033274447, 0.7352589726659631, 6.506530697357813, 6.073093203383851, 2.9280078963040115, 9.732259253669513, 8.666414985925877, 9.64987917657626, 3.532454983537292, 3.3627016578900157, 3.2347961455651886, 2.728490493904925, 7.511950590355525, 9.273240695572607, 6.609258537093443, 0.14506368072333298, 1.4894462202852876, 9.943489486419324, 7.80141344591207, 1.1749516667693805, 2.3838143944937027, 9.367122985353243, 8.074643414805802, 4.4391134174098354, 2.4627640337685985, 2.475605769833067}, y: []float64{-5.195987182305801, -5.124467553511041, -1.5307373603177141, -10.633240904046186, -7.946956318765702, -3.2485193467574556, 0.11431378869876863, -7.3947094151569, 4.132031300174666, 0.8242328952235818, -5.407627875066833, -0.27572618600643184, -8.361376371129028, -6.178598653413382, -3.996916635144412, 2.985589767895781, -3.9866226100163416, 0.14820865260800264, -3.756749545003365, -9.837287738676192, -6.316101787339164, -7.6855843633423175, -0.5252935189495154, -4.409708109151082, -2.3463480427994376, -7.118517883228505, -8.297709474286536, -6.3611849912116085, -9.252064303091755, -6.647954039712843, 3.378184771430283, -3.250573134474263, -9.571989525711174, -6.427820725681273, -5.363124278773774, -6.445464258658584, -10.515952107812282, -0.5609491593966247, -5.99763721379094, -3.278007505387863}, rho: -0.45384615384615384, p: 0.0032669217145351453, slope: -0.5780399625537458, intercept: -1.7998890596506163, low: -0.9591664844758095, high: -0.17351591262044289},
	{name: "pairs_8", x: []float64{1.0, 1.0, 2.0, 2.0, 3.0, 3.0, 4.0, 4.0}, y: []float64{1.0, 2.0, 2.0, 4.0, 3.0, 5.0, 7.0, 6.0}, rho: 0.9081292832965595, p: 0.0018074086274564628, slope: 1.5833333333333335, intercept: -0.4583333333333339, low: 1.0, high: 3.0},
}

// TestSignedRankGolden checks T and both p-values against
// scipy.stats.wilcoxon (SciPy 1.10.1, literals above): the exact p-values
// are dyadic rationals, equal to 1e-14 relative; the normal approximation
// is the same closed formula, equal to 1e-12 relative.
func TestSignedRankGolden(t *testing.T) {
	for _, c := range signedRankGolden {
		t.Run(c.name, func(t *testing.T) {
			if c.exact != nil {
				got, err := SignedRank(c.d, SignedRankOptions{Method: MethodExact})
				if err != nil {
					t.Fatal(err)
				}
				if got.T != c.exact[0] || !near(got.P, c.exact[1], 0, 1e-14) { // scipy.stats.wilcoxon(method="exact")
					t.Errorf("exact T = %v p = %.17g, scipy %v %.17g", got.T, got.P, c.exact[0], c.exact[1])
				}
				auto, err := SignedRank(c.d, SignedRankOptions{})
				if err != nil {
					t.Fatal(err)
				}
				if auto.Method != MethodExact || auto.P != got.P {
					t.Errorf("auto chose %s p = %v, want the exact %v", auto.Method, auto.P, got.P)
				}
			}
			got, err := SignedRank(c.d, SignedRankOptions{Method: MethodAsymptotic})
			if err != nil {
				t.Fatal(err)
			}
			if got.T != c.approxT || !near(got.P, c.approxP, 1e-15, 1e-12) { // scipy.stats.wilcoxon(method="approx")
				t.Errorf("approx T = %v p = %.17g, scipy %v %.17g", got.T, got.P, c.approxT, c.approxP)
			}
		})
	}
}

// TestSignedRankEnumeration checks the exact null distribution against a
// brute-force enumeration of all 2^n sign patterns (the definition of the
// test, Wilcoxon 1945) for n = 1…12, and the smallest p-value 2/2^n.
func TestSignedRankEnumeration(t *testing.T) {
	for n := 1; n <= 12; n++ {
		top := n * (n + 1) / 2
		count := make([]float64, top+1)
		for mask := 0; mask < 1<<n; mask++ {
			w := 0
			for k := 1; k <= n; k++ {
				if mask&(1<<(k-1)) != 0 {
					w += k
				}
			}
			count[w]++
		}
		pmf := signedRankPMF(n)
		for w := range count {
			if want := count[w] / float64(int(1)<<n); pmf[w] != want {
				t.Fatalf("n = %d: P(W+ = %d) = %v, enumeration %v", n, w, pmf[w], want)
			}
		}
		d := make([]float64, n)
		for i := range d {
			d[i] = float64(i + 1)
		}
		r, err := SignedRank(d, SignedRankOptions{Method: MethodExact})
		if err != nil {
			t.Fatal(err)
		}
		if r.P != SignedRankMinP(n) {
			t.Errorf("n = %d all positive: p = %v, want 2/2^n = %v", n, r.P, SignedRankMinP(n))
		}
	}
}

// TestSignedRankProperties: the p-value is invariant under d → c·d (c > 0)
// and under negation (two-sided), zeros are dropped and counted, and ties
// with MethodExact are refused (the exact distribution assumes ranks 1…n).
func TestSignedRankProperties(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	d := make([]float64, 14)
	for i := range d {
		d[i] = rng.NormFloat64() + 0.3
	}
	base, _ := SignedRank(d, SignedRankOptions{})
	scaled := make([]float64, len(d))
	neg := make([]float64, len(d))
	for i, v := range d {
		scaled[i] = 3.5 * v
		neg[i] = -v
	}
	s, _ := SignedRank(scaled, SignedRankOptions{})
	ng, _ := SignedRank(neg, SignedRankOptions{})
	if s.P != base.P || ng.P != base.P || ng.WPlus != float64(14*15/2)-base.WPlus {
		t.Errorf("p %v, scaled %v, negated %v (W+ %v and %v)", base.P, s.P, ng.P, base.WPlus, ng.WPlus)
	}
	withZeros := append([]float64{0, 0}, d...)
	z, _ := SignedRank(withZeros, SignedRankOptions{Method: MethodAsymptotic})
	a, _ := SignedRank(d, SignedRankOptions{Method: MethodAsymptotic})
	if z.Zeros != 2 || z.N != len(d) || z.P != a.P {
		t.Errorf("zeros %d n %d p %v, want 2, %d, %v", z.Zeros, z.N, z.P, len(d), a.P)
	}
	if _, err := SignedRank([]float64{1, 1, 2}, SignedRankOptions{Method: MethodExact}); err != ErrTiesExact {
		t.Errorf("exact with ties: err %v, want ErrTiesExact", err)
	}
	if _, err := SignedRank(nil, SignedRankOptions{}); err == nil {
		t.Error("empty input accepted")
	}
	if r, _ := SignedRank([]float64{0, 0}, SignedRankOptions{}); r.P != 1 || r.N != 0 {
		t.Errorf("all zeros: p %v n %d, want 1 and 0", r.P, r.N)
	}
}

// TestTrendGolden checks Spearman's ρ and p and the Theil–Sen slope,
// intercept and 95 % interval against scipy.stats.spearmanr and
// scipy.stats.theilslopes (SciPy 1.10.1, literals above). The slopes are
// picked order statistics of the same pairwise slopes, so they agree to
// rounding (1e-12 relative); ρ and p to 1e-10 (p from Student's t,
// gonum against SciPy's special functions).
func TestTrendGolden(t *testing.T) {
	for _, c := range trendGolden {
		t.Run(c.name, func(t *testing.T) {
			s := Spearman(c.x, c.y)
			if !near(s.Rho, c.rho, 1e-14, 1e-12) || !near(s.P, c.p, 1e-14, 1e-10) { // scipy.stats.spearmanr
				t.Errorf("Spearman ρ = %.15g p = %.15g, scipy %.15g %.15g", s.Rho, s.P, c.rho, c.p)
			}
			ts := TheilSen(c.x, c.y, 0.95)
			for _, q := range []struct {
				name      string
				got, want float64
			}{{"slope", ts.Slope, c.slope}, {"intercept", ts.Intercept, c.intercept}, {"low", ts.Low, c.low}, {"high", ts.High, c.high}} {
				if !near(q.got, q.want, 1e-13, 1e-12) { // scipy.stats.theilslopes
					t.Errorf("Theil–Sen %s = %.17g, scipy %.17g", q.name, q.got, q.want)
				}
			}
		})
	}
}

// TestTheilSenProperties: an exact line is recovered with a zero-width
// interval (every pairwise slope equals it), y → a·y + b scales the slope
// and interval by a, and one distinct x gives NaN.
func TestTheilSenProperties(t *testing.T) {
	x := []float64{0.6, 0.6, 0.9, 0.9, 1.2, 1.2, 1.5}
	y := make([]float64, len(x))
	for i, v := range x {
		y[i] = 2 - 3*v
	}
	r := TheilSen(x, y, 0)
	if !near(r.Slope, -3, 1e-12, 0) || !near(r.Low, -3, 1e-12, 0) || !near(r.High, -3, 1e-12, 0) || !near(r.Intercept, 2, 1e-12, 0) || r.Level != 0.95 {
		t.Errorf("exact line: %+v", r)
	}
	rng := rand.New(rand.NewPCG(9, 9))
	for i := range y {
		y[i] += rng.NormFloat64()
	}
	r = TheilSen(x, y, 0.9)
	y2 := make([]float64, len(y))
	for i, v := range y {
		y2[i] = 4*v + 7
	}
	r2 := TheilSen(x, y2, 0.9)
	if !near(r2.Slope, 4*r.Slope, 1e-12, 1e-12) || !near(r2.Low, 4*r.Low, 1e-12, 1e-12) || !near(r2.High, 4*r.High, 1e-12, 1e-12) {
		t.Errorf("affine y: %+v against %+v", r2, r)
	}
	if !(r.Low <= r.Slope && r.Slope <= r.High) {
		t.Errorf("interval [%v, %v] does not hold the slope %v", r.Low, r.High, r.Slope)
	}
	if c := TheilSen([]float64{1, 1, 1}, []float64{1, 2, 3}, 0); !math.IsNaN(c.Slope) || c.Slopes != 0 {
		t.Errorf("one distinct x: %+v", c)
	}
}
