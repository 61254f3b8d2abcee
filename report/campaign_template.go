package report

// campaignCSS adds the campaign page's rules to the shared style sheet:
// the verdict grid (cells coloured by class with the class letter and top
// probability in dark text, so colour is never the only cue), the
// figures' HTML legends and the wide tables.
const campaignCSS = `.grids { display: flex; flex-wrap: wrap; gap: .5rem 2rem; align-items: flex-start; }
table.grid { width: auto; border-collapse: separate; border-spacing: 3px; font-size: .8rem; margin: .2rem 0 .6rem; }
table.grid caption { text-align: left; font-weight: 600; padding-bottom: .2rem; font-family: "DejaVu Sans", Helvetica, Arial, sans-serif; }
table.grid th, table.grid td { border: none; padding: 0; text-align: center; }
table.grid th { font-weight: 600; padding: 0 .3rem; }
table.grid th.dev { text-align: right; font-weight: 400; color: var(--muted); }
td.cell { min-width: 4.2rem; }
span.v { display: block; margin: 1px 0; padding: .25rem .3rem; color: #000000; border-radius: 2px; font-variant-numeric: tabular-nums; cursor: default; }
span.v:focus, span.v:hover { outline: 2px solid var(--ink); outline-offset: 1px; }
td.empty { color: var(--muted); }
p.readout { min-height: 1.5em; font-size: .84rem; font-family: "DejaVu Sans", Helvetica, Arial, sans-serif; }
p.legend { font-size: .8rem; font-family: "DejaVu Sans", Helvetica, Arial, sans-serif; margin: .4rem 0; }
p.legend span { white-space: nowrap; margin-right: .9rem; }
svg.sw { vertical-align: middle; margin-right: .15rem; }
span.key { display: inline-block; width: .9rem; height: .9rem; vertical-align: -.1rem; margin-right: .25rem; border-radius: 2px; }
.wide { overflow-x: auto; }
table.counts { width: auto; }
table.counts td, table.counts th { padding-right: 1.6rem; }
p.agreement a { color: var(--accent); }
td.sig, th.sig { font-weight: 700; }
tr.any td.metric { font-weight: 700; }
ul.warnings li { margin: .15rem 0; }
@media print { .grids { gap: .3rem 1rem; } .wide { overflow: visible; } p.readout { display: none; } }
`

// campaignScript shows the probabilities of the grid cell under the
// pointer or the keyboard focus in the line below the grid (title
// tooltips do not appear on touch screens or on focus), and records on
// that line how many cells it serves (data-cells, read by the browser
// test). Written without "<" and "&" so the page stays well-formed XML.
const campaignScript = `(function () {
  var out = document.getElementById("grid-readout");
  if (!out) { return; }
  var cells = document.querySelectorAll("span.v[title]");
  cells.forEach(function (c) {
    var show = function () { out.textContent = c.getAttribute("title"); };
    c.addEventListener("mouseenter", show);
    c.addEventListener("focus", show);
  });
  out.setAttribute("data-cells", String(cells.length));
})();`

// campaignTemplate is the HTML of the campaign report (its head, style
// sheet and figure parts are in page.go).
const campaignTemplate = `{{template "head" .}}
{{template "masthead" .}}
<p class="caution"><strong>Caution.</strong> {{.Caution}}</p>
{{- if .Warnings}}
<p class="agreement"><strong>{{len .Warnings}} {{if eq (len .Warnings) 1}}warning{{else}}warnings{{end}}:</strong> some tests cannot reach significance with the traces or surrogates at hand, whatever the data; <a href="#warnings">what would</a> is in section 4.</p>
{{- end}}
<nav>{{template "nav" .Nav}}
</nav>
</header>

<section id="verdicts">
<h2><span class="no">1</span>Verdicts</h2>
{{- if .Grids}}
<p>The classifier's verdict on every trace: a row per device, a column per level of {{.ParamLabel}}, one grid per group. Each cell shows the class's letter and its probability; the probabilities of all classes appear on hover (or focus, below the grids). Colours of Okabe &amp; Ito (2008), distinct for the common colour-vision deficiencies:
{{- range .Classes}} <span class="key" style="background: {{.Colour}}"></span>{{.Letter}} {{.Class}} ({{.Count}}){{end}}.</p>
<div class="grids">
{{- range .Grids}}
<table class="grid">
<caption>{{.Group}}</caption>
<thead><tr><th class="dev">device</th>{{range .Levels}}<th>{{.}}</th>{{end}}</tr></thead>
<tbody>
{{- range .Rows}}
<tr><th class="dev">{{.Device}}</th>{{range .Cells}}{{if .}}<td class="cell">{{range .}}<span class="v" tabindex="0" style="background: {{.Colour}}" title="{{.Title}}">{{.Text}}</span>{{end}}</td>{{else}}<td class="cell empty">·</td>{{end}}{{end}}</tr>
{{- end}}
</tbody>
</table>
{{- end}}
</div>
<p class="readout" id="grid-readout" aria-live="polite"></p>
<table class="compact counts">
<thead><tr><th>group</th><th>{{.ParamLabel}}</th>{{range .Classes}}<th class="n">{{.Class}}</th>{{end}}</tr></thead>
<tbody>
{{- range .VerdictCounts}}
<tr><td>{{.Group}}</td><td>{{.Level}}</td>{{range .Counts}}<td class="n">{{.}}</td>{{end}}</tr>
{{- end}}
</tbody>
</table>
{{- else}}
<p class="muted">No verdicts: the per-trace tables hold none (measured with --no-verdicts, or by a version without them).</p>
{{- end}}
</section>

<section id="curves">
<h2><span class="no">2</span>Metrics against {{.ParamLabel}}</h2>
<p>For each metric, one panel per surrogate method. Does the metric move with {{.ParamLabel}}, and do the groups part? Does it change when the series is shuffled (temporal correlations destroyed), Gaussianised (values made Gaussian, rank order kept), or replaced by IAAFT surrogates (linear correlations and values kept)? Marks follow the {{.AdjustName}}-adjusted tests of section 4.</p>
{{.GroupLegend}}
{{- range .Curves}}
{{template "figure" .}}
{{- end}}
</section>

<section id="distributions">
<h2><span class="no">3</span>Distributions</h2>
<p>Degrees and local clustering of the natural (NVG) and horizontal (HVG) visibility graphs and the normalised increments, pooled per group at each level; ✱ marks the levels where the groups' pooled distributions differ ({{.AdjustName}}-adjusted permutation tests, table in section 4).</p>
{{.DistLegend}}
{{- range .Distributions}}
{{template "figure" .}}
{{- end}}
{{- if .Tails}}
<h3>Fitted tails</h3>
<p class="muted" style="font-size: .84rem">The exponential tail of the HVG degrees and the power law of the NVG degrees, fitted by maximum likelihood to the pooled nodes with k_min chosen by the Kolmogorov–Smirnov distance (± asymptotic standard error; share: nodes with k ≥ k_min).</p>
<div class="wide"><table class="compact">
<thead><tr><th class="code">distribution</th><th>group</th><th>{{.ParamLabel}}</th><th class="n">traces</th><th class="n">nodes</th><th>law</th><th class="n">exponent</th><th class="n">k_min</th><th class="n">share</th><th class="n">KS</th><th>note</th></tr></thead>
<tbody>
{{- range .Tails}}
<tr><td class="code">{{.Name}}</td><td>{{.Group}}</td><td>{{.Level}}</td><td class="n">{{.Traces}}</td><td class="n">{{.Nodes}}</td><td>{{.Law}}</td><td class="n">{{.Exponent}}</td><td class="n">{{.KMin}}</td><td class="n">{{.Share}}</td><td class="n">{{.KS}}</td><td>{{.Note}}</td></tr>
{{- end}}
</tbody>
</table></div>
{{- end}}
</section>

<section id="tests">
<h2><span class="no">4</span>Tests</h2>
<p>Each question is a multiple-testing family of its own, adjusted by Holm and by Benjamini–Hochberg; <strong>bold</strong>: {{.AdjustName}}-adjusted p ≤ {{.Alpha}}. Raw p-values, both adjustments and every per-trace test are in tests.csv.</p>
{{- if .Warnings}}
<h3 id="warnings">Warnings: what these data cannot show</h3>
<ul class="notes warnings">{{template "notes" .Warnings}}
</ul>
{{- end}}
{{- range .GroupTables}}
<h3>{{.Title}}</h3>
<p class="muted" style="font-size: .84rem">Medians per group; Cliff's δ of {{.B}} over {{.A}}; Hodges–Lehmann shift; Kolmogorov–Smirnov and Mann–Whitney on the traces; Wilcoxon signed-rank on the devices measured in both groups (median paired difference Δ, rank-biserial r). p-values raw, adjusted in brackets.</p>
<div class="wide"><table class="compact">
<thead><tr><th class="code">metric</th><th class="n">median {{.A}}</th><th class="n">median {{.B}}</th><th class="n">Cliff's δ</th><th class="n">HL shift</th><th class="n">KS p ({{.AdjustName}})</th><th class="n">MW p ({{.AdjustName}})</th><th class="n">pairs</th><th class="n">paired Δ</th><th class="n">r</th><th class="n">signed-rank p ({{.AdjustName}})</th></tr></thead>
<tbody>
{{- range .Rows}}
<tr{{if .Any}} class="any"{{end}}><td class="code metric">{{.Metric}}</td><td class="n">{{.MedA}}</td><td class="n">{{.MedB}}</td><td class="n">{{.Delta}}</td><td class="n">{{.HL}}</td>{{template "p" .KS}}{{template "p" .MW}}<td class="n">{{.Pairs}}</td><td class="n">{{.Paired}}</td><td class="n">{{.R}}</td>{{template "p" .SR}}</tr>
{{- end}}
</tbody>
</table></div>
{{- end}}
{{- if .Trends}}
<h3>Trends with {{.ParamLabel}}</h3>
<div class="wide"><table class="compact">
<thead><tr><th class="code">metric</th><th>group</th><th class="n">n</th><th class="n">Spearman ρ</th><th class="n">p</th><th class="n">{{.AdjustName}}</th><th class="n">Theil–Sen slope</th><th class="n">{{.IntervalPct}} interval</th><th>note</th></tr></thead>
<tbody>
{{- range .Trends}}
<tr><td class="code">{{.Metric}}</td><td>{{.Group}}</td><td class="n">{{.N}}</td><td class="n">{{.Rho}}</td>{{template "p" .P}}{{template "p" .Adj}}<td class="n">{{.Slope}}</td><td class="n">{{.Interval}}</td><td>{{.Note}}</td></tr>
{{- end}}
</tbody>
</table></div>
{{- end}}
{{- range .SurrogateTables}}
<h3>Original against {{.Method}} surrogates</h3>
<p class="muted" style="font-size: .84rem">Wilcoxon signed-rank test of original − mean of the trace's surrogates over the traces of each group and level: r is the rank-biserial correlation (+1: every original above its surrogates), p the adjusted p-value.</p>
<div class="wide"><table class="compact">
<thead><tr><th class="code">metric</th>{{range .Columns}}<th class="n">{{.}}</th>{{end}}</tr></thead>
<tbody>
{{- range .Rows}}
<tr><td class="code">{{.Metric}}</td>{{range .Cells}}{{template "p" .}}{{end}}</tr>
{{- end}}
</tbody>
</table></div>
{{- end}}
{{- if .DistRows}}
<h3>Pooled distributions between groups</h3>
<div class="wide"><table class="compact">
<thead><tr><th class="code">distribution</th><th>{{.ParamLabel}}</th><th>groups</th><th class="n">KS distance</th><th class="n">p</th><th class="n">{{.AdjustName}}</th><th class="n">χ² distance</th><th class="n">p</th><th class="n">{{.AdjustName}}</th><th>bins</th></tr></thead>
<tbody>
{{- range .DistRows}}
<tr><td class="code">{{.Name}}</td><td>{{.Level}}</td><td>{{.Groups}}</td><td class="n">{{.KS}}</td>{{template "p" .KSP}}{{template "p" .KSAdj}}<td class="n">{{.Chi}}</td>{{template "p" .ChiP}}{{template "p" .ChiAdj}}<td>{{.Bins}}</td></tr>
{{- end}}
</tbody>
</table></div>
{{- end}}
{{- if .FlipRows}}
<h3>Increments against their Gaussianised surrogates</h3>
<div class="wide"><table class="compact">
<thead><tr><th>group</th><th>{{.ParamLabel}}</th><th class="n">traces</th><th class="n">original: sup|F − Φ|</th><th class="n">Gaussianised: sup|F − Φ|</th><th class="n">KS distance</th><th class="n">p</th><th class="n">{{.AdjustName}}</th></tr></thead>
<tbody>
{{- range .FlipRows}}
<tr><td>{{.Group}}</td><td>{{.Level}}</td><td class="n">{{.N}}</td><td class="n">{{.Orig}}</td><td class="n">{{.Gauss}}</td><td class="n">{{.D}}</td>{{template "p" .P}}{{template "p" .Adj}}</tr>
{{- end}}
</tbody>
</table></div>
{{- end}}
<h3>Families</h3>
<p class="muted" style="font-size: .84rem">Reachable: whether the smallest p-value a family's tests can give at these sizes passes the adjusted level at all (the warnings at the top say what would).</p>
<table class="compact">
<thead><tr><th class="code">family</th><th class="n">tests</th><th class="n">smallest attainable p</th><th>reachable</th><th class="n">significant</th></tr></thead>
<tbody>
{{- range .Families}}
<tr><td class="code">{{.Name}}</td><td class="n">{{.Tests}}</td><td class="n">{{.MinP}}</td><td{{if .Unreachable}} class="sig"{{end}}>{{.Reachable}}</td><td class="n">{{.Significant}}</td></tr>
{{- end}}
</tbody>
</table>
{{- if .TraceFamilies}}
<p class="muted" style="font-size: .84rem">{{.TraceFamilies}}</p>
{{- end}}
</section>

<section id="methods">
<h2><span class="no">5</span>Methods and references</h2>
<p><strong>Verdicts.</strong> Each trace is standardised and described by tracesift's feature vector; a random forest (Breiman 2001) trained on labelled reference systems votes for chaotic, stochastic or regular dynamics, and the verdict is undetermined when the top probability is below the model's threshold or the trace lies outside what the model was trained on{{if .Model}} (model: {{.Model}}){{end}}. The single-trace report (tracesift report FILE) shows why.</p>
<p><strong>Metrics.</strong> Natural (Lacasa et al. 2008) and horizontal (Luque et al. 2009) visibility graphs of the standardised trace: degrees, local clustering (Watts &amp; Strogatz 1998), the HVG tail rate λ (Lacasa &amp; Toral 2010) and the NVG power-law exponent γ by discrete maximum likelihood with k_min by the Kolmogorov–Smirnov distance (Clauset, Shalizi &amp; Newman 2009), and the shape of the normalised increments.</p>
<p><strong>Surrogates.</strong> Per trace and method, surrogates seeded by the run seed, the trace's name and the method: random shuffles (any temporal structure destroyed, values kept exactly), Gaussianised series (Gaussian values in the trace's rank order: the shape of the value distribution removed, its temporal order kept) and iterated amplitude-adjusted Fourier transform surrogates (values and, closely, the power spectrum kept; Schreiber &amp; Schmitz 1996). A metric that moves under shuffling is carried by temporal correlations; one that moves under Gaussianisation, by the distribution of the values, such as fat tails.</p>
<p><strong>Tests.</strong> Groups against the reference at each level: two-sample Kolmogorov–Smirnov (Smirnov 1948), Mann–Whitney (Mann &amp; Whitney 1947) with the Hodges–Lehmann shift (Hodges &amp; Lehmann 1963) and Cliff's δ (Cliff 1993), and the Wilcoxon signed-rank test (Wilcoxon 1945) on the devices measured in both groups with the matched-pairs rank-biserial correlation (Kerby 2014). Trends: Spearman's ρ (Spearman 1904) and the Theil–Sen slope (Theil 1950; Sen 1968) with its {{.IntervalPct}} interval. Original against surrogates: the signed-rank test of original − surrogate mean over a group's traces at a level, paired trace by trace. Pooled distributions: KS and χ² distances between groups with whole traces relabelled (a permutation test on the units that vary independently; Good 2000), one bin per distinct value where the values are discrete; the increments against those of their Gaussianised surrogates with paired flips. Each question and test is a family adjusted by Holm (1979) and by Benjamini &amp; Hochberg (1995); a family is flagged when its smallest attainable p-value cannot pass the adjusted level (a rank test against N surrogates cannot give p below 2/(N + 1); Theiler et al. 1992).</p>
<p><strong>Figures.</strong> Medians with quartiles per group and level; surrogate bands span the median over the traces of each trace's 2.5 % and 97.5 % surrogate quantiles. Distributions are pooled with equal weight per trace (degrees: per node). Colours from Okabe &amp; Ito (2008).</p>
<h3>References</h3>
<ol class="refs">
<li>Benjamini Y, Hochberg Y. Controlling the false discovery rate. J. R. Stat. Soc. B 57 (1995) 289.</li>
<li>Breiman L. Random forests. Machine Learning 45 (2001) 5.</li>
<li>Clauset A, Shalizi CR, Newman MEJ. Power-law distributions in empirical data. SIAM Review 51 (2009) 661.</li>
<li>Cliff N. Dominance statistics: ordinal analyses to answer ordinal questions. Psychol. Bull. 114 (1993) 494.</li>
<li>Good P. Permutation Tests. Springer (2000) (memory).</li>
<li>Hodges JL, Lehmann EL. Estimates of location based on rank tests. Ann. Math. Statist. 34 (1963) 598.</li>
<li>Holm S. A simple sequentially rejective multiple test procedure. Scand. J. Statist. 6 (1979) 65.</li>
<li>Kerby DS. The simple difference formula: an approach to teaching nonparametric correlation. Compr. Psychol. 3 (2014) 11 (memory).</li>
<li>Lacasa L, Luque B, Ballesteros F, Luque J, Nuño JC. From time series to complex networks: the visibility graph. PNAS 105 (2008) 4972.</li>
<li>Lacasa L, Toral R. Description of stochastic and chaotic series using visibility graphs. Phys. Rev. E 82 (2010) 036120.</li>
<li>Luque B, Lacasa L, Ballesteros F, Luque J. Horizontal visibility graphs: exact results for random time series. Phys. Rev. E 80 (2009) 046103.</li>
<li>Mann HB, Whitney DR. On a test of whether one of two random variables is stochastically larger than the other. Ann. Math. Statist. 18 (1947) 50 (memory).</li>
<li>Okabe M, Ito K. Color Universal Design (2008) (checked: search.r-project.org/CRAN/refmans/see/html/scale_color_okabeito.html).</li>
<li>Schreiber T, Schmitz A. Improved surrogate data for nonlinearity tests. Phys. Rev. Lett. 77 (1996) 635.</li>
<li>Sen PK. Estimates of the regression coefficient based on Kendall's tau. J. Am. Stat. Assoc. 63 (1968) 1379.</li>
<li>Smirnov N. Table for estimating the goodness of fit of empirical distributions. Ann. Math. Stat. 19 (1948) 279.</li>
<li>Spearman C. The proof and measurement of association between two things. Am. J. Psychol. 15 (1904) 72.</li>
<li>Theil H. A rank-invariant method of linear and polynomial regression analysis. Proc. K. Ned. Akad. Wet. 53 (1950) 386.</li>
<li>Theiler J, Eubank S, Longtin A, Galdrikian B, Farmer JD. Testing for nonlinearity in time series: the method of surrogate data. Physica D 58 (1992) 77.</li>
<li>Watts DJ, Strogatz SH. Collective dynamics of small-world networks. Nature 393 (1998) 440.</li>
<li>Wilcoxon F. Individual comparisons by ranking methods. Biometrics Bull. 1 (1945) 80.</li>
</ol>
{{- if .Notes}}
<h3>Notes</h3>
<ul class="notes">{{template "notes" .Notes}}
</ul>
{{- end}}
{{- if .LeftOut}}
<h3>Left out</h3>
<p>These entries of the campaign could not be used and are in no test:</p>
<ul class="notes">{{template "notes" .LeftOut}}
</ul>
{{- end}}
<p class="caution"><strong>Caution.</strong> {{.Caution}}</p>
</section>
<footer>{{.Footer}}</footer>
<script>` + campaignScript + `</script>
</body>
</html>
{{- define "p"}}<td class="n{{if .Sig}} sig{{end}}">{{.Text}}</td>{{end}}`
