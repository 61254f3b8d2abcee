// Package surrogate makes surrogate data and tests any statistic of a series
// for significance against them.
//
// A surrogate series shares chosen properties of the data (its values, its
// power spectrum, or both) and is otherwise random. Computing a
// discriminating statistic on the data and on M surrogates gives a rank test
// of the null hypothesis that the surrogates embody: if the data's value is
// extreme among the M+1 values, the null is rejected. Theiler et al.,
// Physica D 58 (1992) 77; Schreiber & Schmitz, Phys. Rev. Lett. 77 (1996)
// 635 and Physica D 142 (2000) 346.
//
// Generators (see Method): random shuffle, Fourier phase randomisation (FT),
// amplitude-adjusted FT (AAFT), iterated AAFT (IAAFT) and Gaussianisation.
// Generate makes surrogates; Test runs the rank test for a list of
// statistics, with Holm's adjustment when several are tested; Plot draws the
// surrogate distribution of one statistic with the observed value marked.
//
// Every surrogate i is drawn from its own random source derived from
// (Options.Seed, i), so the output is bit-identical for a seed whatever the
// number of workers. Transforms use gonum's real FFT; lengths with a large
// prime factor go through Bluestein's chirp-z algorithm so that every length
// costs O(n log n).
package surrogate
