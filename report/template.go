package report

// pageTemplate is the HTML of the single-trace report (its head, style
// sheet and figure parts are in page.go).
const pageTemplate = `{{template "head" .}}
{{template "masthead" .}}
{{- if .TraceWarnings}}
<p><strong>Notes from reading the file:</strong></p>
<ul class="notes">{{template "notes" .TraceWarnings}}
</ul>
{{- end}}
<nav>{{template "nav" .Nav}}
</nav>
</header>

<section id="verdict">
<h2><span class="no">1</span>Verdict</h2>
<div class="verdict cls-{{.Class}}">
<p class="cls">{{.Class}}</p>
<p class="line">{{.ClassLine}}</p>
</div>
{{- if .DeterminismLine}}
<p class="agreement"><strong>Surrogate test of determinism (section 6):</strong> {{.DeterminismLine}}</p>
{{- end}}
<p class="caution"><strong>Caution.</strong> {{.Caution}}</p>
{{template "figure" .ProbFig}}
{{- if .Reasons}}
<p><strong>Why undetermined:</strong></p>
<ul class="notes">{{template "notes" .Reasons}}
</ul>
{{- end}}
<h3>Warnings</h3>
{{- if .Warnings}}
<ul class="notes">{{template "notes" .Warnings}}
</ul>
{{- else}}
<p class="muted">No recording-quality warnings (length, clipping, quantisation, drift, mains interference).</p>
{{- end}}
<p class="muted" style="font-size: .82rem">What each warning tests and the smallest effect it detects: <a href="#warning-limits">Methods, recording warnings</a>.</p>
<h3>Features that drove the verdict</h3>
<table>
<thead><tr><th class="code">feature</th><th class="n">value</th><th class="n">contribution</th><th></th><th>meaning</th></tr></thead>
<tbody>
{{- range .Drivers}}
<tr><td class="code">{{.Feature}}</td><td class="n">{{.Value}}</td><td class="n">{{.Contribution}}</td><td>{{.Bar}}</td><td>{{.Meaning}}</td></tr>
{{- end}}
</tbody>
</table>
<p class="muted" style="font-size: .82rem">{{.DriversNote}}</p>
</section>

<section id="trace">
<h2><span class="no">2</span>The trace and its increments</h2>
{{- template "failures" .TraceFailures}}
{{- with .TraceFig}}
{{template "figure" .}}
{{- end}}
{{- with .IncFig}}
{{template "figure" .}}
{{- end}}
</section>

<section id="degrees">
<h2><span class="no">3</span>Visibility graphs: degree distributions</h2>
<p>Each sample becomes a node. In the horizontal visibility graph two samples are linked when every sample between them is lower than both; in the natural visibility graph, when every sample between them lies below the straight line joining them. {{.DegreesNote}}</p>
{{- template "failures" .DegreesFailures}}
<div class="pair">
{{- with .HVGFig}}
{{template "figure" .}}
{{- end}}
{{- with .NVGFig}}
{{template "figure" .}}
{{- end}}
</div>
{{- if .GraphRows}}
<dl class="facts two">{{template "facts" .GraphRows}}
</dl>
{{- end}}
</section>

<section id="clustering">
<h2><span class="no">4</span>Visibility graphs: local clustering</h2>
<div class="pair">
{{- with .ClustFig}}
{{template "figure" .}}
{{- end}}
{{- with .CkFig}}
{{template "figure" .}}
{{- end}}
</div>
{{- if .ClusteringNote}}
<p>{{.ClusteringNote}}</p>
{{- else}}
<p class="failed">Not shown: the visibility graphs could not be built (see section 3).</p>
{{- end}}
{{- with .NetworkTable}}
<h3>One stretch, four networks</h3>
<p>{{.Note}}</p>
<table class="compact">
<tr><th>metric</th>{{range .Head}}<th>{{.}}</th>{{end}}</tr>
{{- range .Rows}}
<tr><td>{{.Label}}</td>{{range .Cells}}<td>{{.}}</td>{{end}}</tr>
{{- end}}
</table>
{{- end}}
</section>

<section id="plane">
<h2><span class="no">5</span>Complexity–entropy plane</h2>
{{- template "failures" .PlaneFailures}}
{{- with .PlaneFig}}
{{template "figure" .}}
{{- end}}
{{- if .PlaneNote}}
<p>{{.PlaneNote}}</p>
{{- end}}
{{- if .RefRows}}
<table class="compact">
<thead><tr><th>reference</th><th class="code">system</th><th>class</th><th class="n">entropy H</th><th class="n">complexity C</th></tr></thead>
<tbody>
{{- range .RefRows}}
<tr><td>{{.Label}}</td><td class="code">{{.System}}</td><td class="txt-{{.Class}}">{{.Class}}</td><td class="n">{{.Entropy}}</td><td class="n">{{.Complexity}}</td></tr>
{{- end}}
</tbody>
</table>
{{- end}}
</section>

<section id="surrogates">
<h2><span class="no">6</span>Surrogate tests</h2>
{{- if .SurrogatesSkipped}}
<p class="muted">Skipped at the caller's request.</p>
{{- end}}
{{- range .SurrogateFailures}}
<p class="failed">Not computed: {{.}}</p>
{{- end}}
{{- if .DetIntro}}
<h3>Determinism test</h3>
<p>{{.DetIntro}}</p>
{{template "tests" .DetRows}}
<p class="agreement"><strong>Model and test.</strong> {{.DetAgreement}}</p>
{{- end}}
{{- if .SurrogateIntro}}
<h3>Further statistics</h3>
<p>{{.SurrogateIntro}}</p>
{{template "tests" .SurrogateRows}}
{{- end}}
{{- with .SurrogateFig}}
{{template "figure" .}}
{{- end}}
{{- if .SurrogateNotes}}
<ul class="notes">{{template "notes" .SurrogateNotes}}
</ul>
{{- end}}
</section>

<section id="methods">
<h2><span class="no">7</span>Methods and references</h2>
<p><strong>Verdict.</strong> The trace is standardised (so its units do not matter) and described by the feature vector below; a random forest (Breiman 2001) trained on labelled reference systems votes for chaotic, stochastic or regular dynamics. Traces longer than the screening window are measured in evenly spaced windows whose probabilities are averaged. The verdict is undetermined when the top probability is below the model's threshold or features lie outside the range the model was trained on. Feature contributions follow Saabas (2014).</p>
<p><strong>Increments.</strong> Histogram with the Freedman–Diaconis bin width on a symmetric range (40 bins for short traces); the Gaussian has the increments' mean and standard deviation. The Kolmogorov–Smirnov distance is judged against the Lilliefors critical value because the Gaussian is fitted (Lilliefors 1967).</p>
<p><strong>Visibility graphs.</strong> Natural visibility (Lacasa et al. 2008) and horizontal visibility (Luque et al. 2009); HVG tail rate by maximum likelihood of a geometric tail with k_min chosen by the Kolmogorov–Smirnov distance (Lacasa &amp; Toral 2010); NVG power-law exponent by discrete maximum likelihood (Clauset, Shalizi &amp; Newman 2009); local clustering by triangle counting (Watts &amp; Strogatz 1998).</p>
<p><strong>Complexity–entropy plane.</strong> Ordinal patterns (Bandt &amp; Pompe 2002), normalised permutation entropy and Jensen–Shannon statistical complexity (Rosso et al. 2007), bounds after Martin, Plastino &amp; Rosso (2006). Reference series come from tracesift's generators at fixed seeds and the trace's length.</p>
<p><strong>Surrogates.</strong> Iterated amplitude-adjusted Fourier transform surrogates (Schreiber &amp; Schmitz 1996) keep the values and, closely, the power spectrum: they embody a static monotone transform of a linear Gaussian process. The determinism test (the test of <code>classify --significance</code>) compares the simplex forecast skill (Sugihara &amp; May 1990) and the time-reversal asymmetry of the increments (Theiler et al. 1992) of the rank-Gaussianised trace, both at the embedding delay (first minimum of the mutual information, Fraser &amp; Swinney 1986; dimension by Cao 1997), with their surrogate distributions. Rank-based p-values (Theiler et al. 1992; Schreiber &amp; Schmitz 2000), Holm's step-down adjustment across statistics (Holm 1979).</p>
<p><strong>Recording warnings.</strong> Computed on the whole trace before the features. Clipping: the count on the extreme level against the most an unclipped edge allows given the levels inside it. Drift: the least-squares straight line against the trace's own slow fluctuations, whose spectrum at the lowest frequencies is a power law fitted by log-periodogram regression (Geweke &amp; Porter-Hudak 1983) and integrated down to zero frequency. Mains lines: periodogram ordinates near 50 and 60 Hz and their harmonics against the median of the ordinates beside them; the ordinates of a smooth spectrum are independent exponential variables (Brillinger 1981), so the chance that one exceeds a multiple of the median follows exactly from Rényi's representation of order statistics (Rényi 1953). The rules and the detection limits measured on synthetic traces:</p>
<table class="compact" id="warning-limits">
<thead><tr><th>warning</th><th>rule</th><th>measured detection limit and false alarms</th></tr></thead>
<tbody>
{{- range .WarningLimits}}
<tr><td class="code">{{.Warning}}</td><td>{{.Rule}}</td><td>{{if .Limit}}{{.Limit}}{{else}}a fixed rule, no detection limit to measure{{end}}</td></tr>
{{- end}}
</tbody>
</table>
<h3>Model</h3>
<dl class="facts two">{{template "facts" .ModelFacts}}
</dl>
<h3>References</h3>
<ol class="refs">
<li>Bandt C, Pompe B. Permutation entropy: a natural complexity measure for time series. Phys. Rev. Lett. 88 (2002) 174102.</li>
<li>Breiman L. Random forests. Machine Learning 45 (2001) 5.</li>
<li>Brillinger DR. Time Series: Data Analysis and Theory. Holden-Day (1981) (memory).</li>
<li>Cao L. Practical method for determining the minimum embedding dimension of a scalar time series. Physica D 110 (1997) 43.</li>
<li>Clauset A, Shalizi CR, Newman MEJ. Power-law distributions in empirical data. SIAM Review 51 (2009) 661.</li>
<li>Fraser AM, Swinney HL. Independent coordinates for strange attractors from mutual information. Phys. Rev. A 33 (1986) 1134.</li>
<li>Geweke J, Porter-Hudak S. The estimation and application of long memory time series models. J. Time Ser. Anal. 4 (1983) 221 (checked: search.r-project.org/CRAN/refmans/LongMemoryTS/html/gph.html).</li>
<li>Holm S. A simple sequentially rejective multiple test procedure. Scand. J. Statist. 6 (1979) 65.</li>
<li>Lacasa L, Luque B, Ballesteros F, Luque J, Nuño JC. From time series to complex networks: the visibility graph. PNAS 105 (2008) 4972.</li>
<li>Lacasa L, Luque B, Luque J, Nuño JC. The visibility graph: a new method for estimating the Hurst exponent of fractional Brownian motion. EPL 86 (2009) 30001 (checked: arxiver.lazybrains.com/author/124807, arXiv:0901.0888).</li>
<li>Lacasa L, Toral R. Description of stochastic and chaotic series using visibility graphs. Phys. Rev. E 82 (2010) 036120.</li>
<li>Lilliefors HW. On the Kolmogorov–Smirnov test for normality with mean and variance unknown. J. Am. Stat. Assoc. 62 (1967) 399 (checked: rdrr.io/cran/PoweR/man/stat0001.Lilliefors.html).</li>
<li>Luque B, Lacasa L, Ballesteros F, Luque J. Horizontal visibility graphs: exact results for random time series. Phys. Rev. E 80 (2009) 046103.</li>
<li>Martin MT, Plastino A, Rosso OA. Generalized statistical complexity measures: geometrical and analytical properties. Physica A 369 (2006) 439 (checked: search.r-project.org/CRAN/refmans/statcomp/html/maxd6.html).</li>
<li>Núñez AM, Lacasa L, Gómez JP, Luque B. Visibility algorithms: a short review (2012) (memory).</li>
<li>Rényi A. On the theory of order statistics. Acta Math. Acad. Sci. Hung. 4 (1953) 191 (memory).</li>
<li>Rosso OA, Larrondo HA, Martin MT, Plastino A, Fuentes MA. Distinguishing noise from chaos. Phys. Rev. Lett. 99 (2007) 154102.</li>
<li>Saabas A. Interpreting random forests (2014), blog post (memory).</li>
<li>Schreiber T, Schmitz A. Improved surrogate data for nonlinearity tests. Phys. Rev. Lett. 77 (1996) 635.</li>
<li>Schreiber T, Schmitz A. Surrogate time series. Physica D 142 (2000) 346.</li>
<li>Sugihara G, May RM. Nonlinear forecasting as a way of distinguishing chaos from measurement error in time series. Nature 344 (1990) 734.</li>
<li>Theiler J, Eubank S, Longtin A, Galdrikian B, Farmer JD. Testing for nonlinearity in time series: the method of surrogate data. Physica D 58 (1992) 77.</li>
<li>Watts DJ, Strogatz SH. Collective dynamics of small-world networks. Nature 393 (1998) 440.</li>
</ol>
<h3>Feature vector and catalogue</h3>
<p class="muted" style="font-size: .84rem">Every feature the classifier reads, with this trace's value (the median over windows for long traces), its meaning and its source.</p>
<table class="compact">
<thead><tr><th class="code">feature</th><th>family</th><th class="n">value</th><th>meaning</th><th>reference</th></tr></thead>
<tbody>
{{- range .Features}}
<tr><td class="code">{{.Name}}</td><td>{{.Family}}</td><td class="n">{{.Value}}</td><td>{{.Meaning}}{{if .Missing}}<br/><span class="muted">missing for this trace: {{.Missing}}</span>{{end}}</td><td>{{.Reference}}</td></tr>
{{- end}}
</tbody>
</table>
</section>
<footer>{{.Footer}}</footer>
</body>
</html>
{{/* Sub-template: a table of surrogate tests. The figure and "not shown" sub-templates are in page.go. */ -}}
{{define "tests"}}<table>
<thead><tr><th class="code">statistic</th><th class="n">observed</th><th class="n">surrogates (mean ± sd)</th><th class="n">z</th><th class="n">p</th><th class="n">Holm p</th><th>verdict</th></tr></thead>
<tbody>
{{- range .}}
<tr{{if .Rejected}} class="rejected"{{end}}><td class="code">{{.Stat}}</td><td class="n">{{.Observed}}</td><td class="n">{{.Surrogates}}</td><td class="n">{{.Z}}</td><td class="n">{{.P}}</td><td class="n">{{.PHolm}}</td><td>{{.Verdict}}</td></tr>
{{- end}}
</tbody>
</table>{{end}}`
