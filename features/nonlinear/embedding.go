package nonlinear

// Method names reported in Embedding.
const (
	MethodGiven   = "given"            // supplied by the caller
	MethodAMI     = "ami-first-min"    // first genuine minimum of the AMI
	MethodACF     = "acf-1/e"          // autocorrelation 1/e time (AMI fallback)
	MethodCao     = "cao"              // Cao's E1 saturation
	MethodFNN     = "fnn"              // false nearest neighbours
	MethodTheiler = "2·max(acf,delay)" // default Theiler window
)

// EmbedOptions configures Embed; any of Dim, Delay, Theiler left at zero is
// chosen automatically. The estimators that embed (Lyapunov,
// CorrelationDimension, Prediction) take an EmbedOptions too; pass
// Embedding.Fixed() to reuse one embedding across them.
type EmbedOptions struct {
	Dim     int // embedding dimension d; 0: Cao (or FNN)
	Delay   int // delay τ in samples; 0: first AMI minimum, else ACF 1/e time
	Theiler int // exclusion window in samples; 0: 2·max(ACF time, τ)
	// UseFNN selects the dimension by false nearest neighbours instead of
	// Cao's method (the default).
	UseFNN bool
	// MaxDim is the largest dimension tried. Default 10.
	MaxDim int
	// AMI tunes the mutual-information estimate (see AMIOptions).
	AMI AMIOptions
	// MaxRef caps the reference points of Cao/FNN. Default 1000.
	MaxRef int
	// MaxPoints caps the samples Cao/FNN search (a prefix). Default 20000.
	MaxPoints int
}

// Embedding is a delay embedding y_i = (x_i, x_{i+τ}, …, x_{i+(d−1)τ}) with
// the Theiler window used for neighbour searches and how each was chosen.
type Embedding struct {
	Dim     int // d
	Delay   int // τ, samples
	Theiler int // W, samples: neighbours need |i − j| > W
	// DimMethod, DelayMethod, TheilerMethod hold one of the Method
	// constants.
	DimMethod     string
	DelayMethod   string
	TheilerMethod string
	// ACFTime is the autocorrelation 1/e time in samples (MaxLag when the
	// autocorrelation did not fall to 1/e within it).
	ACFTime int
	// AMI is the mutual-information curve (nil when the delay was given).
	AMI *AMIResult
	// Cao or FNN holds the dimension diagnostics (nil when the dimension
	// was given or the other method was used).
	Cao *CaoResult
	FNN *FNNResult
}

// Fixed returns options that reuse this embedding without searching again:
// pass them as the Embed field of the other estimators' options when several
// measures run on the same series.
func (e *Embedding) Fixed() EmbedOptions {
	return EmbedOptions{Dim: e.Dim, Delay: e.Delay, Theiler: e.Theiler}
}

// Embed chooses a delay embedding for x:
//
//   - delay τ: the first genuine minimum of the average mutual information
//     (Fraser & Swinney 1986; see AverageMutualInformation), falling back to
//     the autocorrelation 1/e time when the AMI has no minimum up to its
//     MaxLag; capped at MaxLag (min(200, n/20)).
//   - Theiler window W: 2·max(autocorrelation time, τ) (Theiler 1986).
//   - dimension d: Cao's E1 saturation (Cao 1997), or false nearest
//     neighbours (Kennel, Brown & Abarbanel 1992) when UseFNN is set.
//
// x needs at least 200 samples for the automatic choice.
//
// Reconstruct does the same and keeps the standardised series with its
// neighbour-search structures for the estimators.
func Embed(x []float64, opts EmbedOptions) (*Embedding, error) {
	r, err := Reconstruct(x, opts)
	if err != nil {
		return nil, err
	}
	return r.emb, nil
}

// defaultMaxLag is the default largest lag of the mutual-information curve
// for n samples: min(200, n/20), at least 1.
func defaultMaxLag(n int) int {
	return max(1, min(200, n/20))
}

// chooseDelay returns the delay (given or automatic), the autocorrelation
// time and the AMI curve (nil if the delay was given).
func chooseDelay(z []float64, opts EmbedOptions) (delay, acf int, ami *AMIResult, err error) {
	maxLag := orDefault(opts.AMI.MaxLag, defaultMaxLag(len(z)))
	acf, _ = autocorrTime(z, maxLag)
	if opts.Delay > 0 {
		return opts.Delay, acf, nil, nil
	}
	ao := opts.AMI
	ao.MaxLag = maxLag
	ami, err = AverageMutualInformation(z, ao)
	if err != nil {
		return 0, 0, nil, err
	}
	delay = ami.FirstMin
	if delay == 0 {
		delay = acf
	}
	return delay, acf, ami, nil
}

// embedStd is Embed on a standardised series; the dimension search shares
// the sorted projection of rec (which may be nil).
func embedStd(z []float64, opts EmbedOptions, rec *Reconstruction) (*Embedding, error) {
	e := &Embedding{DimMethod: MethodGiven, DelayMethod: MethodGiven, TheilerMethod: MethodGiven}
	delay, acf, ami, err := chooseDelay(z, opts)
	if err != nil {
		return nil, err
	}
	e.Delay, e.ACFTime, e.AMI = delay, acf, ami
	if opts.Delay <= 0 {
		e.DelayMethod = MethodAMI
		if ami.FirstMin == 0 {
			e.DelayMethod = MethodACF
		}
	}
	e.Theiler = opts.Theiler
	if e.Theiler <= 0 {
		e.Theiler = defaultTheiler(acf, delay)
		e.TheilerMethod = MethodTheiler
	}
	e.Dim = opts.Dim
	if e.Dim > 0 {
		return e, nil
	}
	maxDim := orDefault(opts.MaxDim, defaultMaxDim)
	// Shrink the search for short series so that it still fits.
	nz := min(len(z), orDefault(opts.MaxPoints, defaultMaxPoints))
	for maxDim > 2 && nz-(maxDim+1)*delay < max(50, 2*e.Theiler+10) {
		maxDim--
	}
	if opts.UseFNN {
		f, err := fnnStd(z, delay, e.Theiler, FNNOptions{MaxDim: maxDim, MaxRef: opts.MaxRef, MaxPoints: opts.MaxPoints})
		if err != nil {
			return nil, err
		}
		e.FNN, e.Dim, e.DimMethod = f, f.Dim, MethodFNN
		return e, nil
	}
	c, err := caoStd(z, delay, e.Theiler, CaoOptions{MaxDim: maxDim, MaxRef: opts.MaxRef, MaxPoints: opts.MaxPoints}, rec)
	if err != nil {
		return nil, err
	}
	e.Cao, e.Dim, e.DimMethod = c, c.Dim, MethodCao
	return e, nil
}
