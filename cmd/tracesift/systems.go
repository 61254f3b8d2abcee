package main

import (
	"fmt"
	"sort"
	"strings"

	"github.com/spf13/cobra"

	"github.com/tracesift/tracesift/generators"
	"github.com/tracesift/tracesift/internal/jsonsafe"
)

func init() { addCommand(newSystemsCmd) }

type systemsOptions struct {
	format string
}

func newSystemsCmd(e *env) *cobra.Command {
	var o systemsOptions
	c := &cobra.Command{
		Use:   "systems",
		Short: "List reference systems, their labels, parameters and published invariants",
		Long: `List the reference systems that 'generate' can produce: each with its class
label at default parameters (chaotic, stochastic or regular), its parameters
with defaults and accepted ranges, and the published or analytic invariants
the benchmark suite checks, with their sources.`,
		Example: `  tracesift systems
  tracesift systems --format json | head -3`,
		Args: cobra.NoArgs,
		RunE: func(c *cobra.Command, _ []string) error {
			if err := checkFormat(o.format, formatTable, formatJSON); err != nil {
				return err
			}
			if o.format == formatJSON {
				return writeSystemsJSON(e, generators.All())
			}
			return writeSystemsTable(e, generators.All())
		},
	}
	c.Flags().StringVar(&o.format, "format", formatTable, "output format: table or json (JSON Lines, one system per line)")
	return c
}

type systemJSON struct {
	Name       string          `json:"name"`
	Title      string          `json:"title"`
	Class      string          `json:"class"`
	TimeAxis   string          `json:"time_axis"`
	Doc        string          `json:"doc"`
	Params     []paramJSON     `json:"params"`
	Invariants []invariantJSON `json:"invariants"`
}

type paramJSON struct {
	Name    string         `json:"name"`
	Default jsonsafe.Float `json:"default"`
	Min     jsonsafe.Float `json:"min"`
	Max     jsonsafe.Float `json:"max"`
	Doc     string         `json:"doc"`
}

type invariantJSON struct {
	Name   string         `json:"name"`
	Value  jsonsafe.Float `json:"value"`
	Unit   string         `json:"unit"`
	Source string         `json:"source"`
}

func writeSystemsJSON(e *env, all []*generators.System) error {
	for _, s := range all {
		cl, err := s.Class(nil)
		if err != nil {
			return err
		}
		j := systemJSON{Name: s.Name, Title: s.Title, Class: string(cl), TimeAxis: s.TimeAxis, Doc: s.Doc,
			Params: []paramJSON{}, Invariants: []invariantJSON{}}
		for _, p := range s.Params {
			j.Params = append(j.Params, paramJSON{p.Name, jsonsafe.Float(p.Default), jsonsafe.Float(p.Min), jsonsafe.Float(p.Max), p.Doc})
		}
		for _, v := range s.Invariants {
			j.Invariants = append(j.Invariants, invariantJSON{v.Name, jsonsafe.Float(v.Value), v.Unit, v.Source})
		}
		if err := writeJSONLine(e.stdout, j); err != nil {
			return err
		}
	}
	return nil
}

func writeSystemsTable(e *env, all []*generators.System) error {
	t := newTable(e.stdout)
	t.row("SYSTEM", "CLASS", "PARAMETERS (default)", "DESCRIPTION")
	for _, s := range all {
		cl, err := s.Class(nil)
		if err != nil {
			return err
		}
		var ps []string
		for _, p := range s.Params {
			ps = append(ps, fmt.Sprintf("%s=%s", p.Name, human(p.Default)))
		}
		t.row(s.Name, string(cl), strings.Join(ps, " "), s.Title)
	}
	if err := t.flush(); err != nil {
		return err
	}
	fmt.Fprintln(e.stdout)
	fmt.Fprintln(e.stdout, "Published invariants (at default parameters):")
	t = newTable(e.stdout)
	t.row("SYSTEM", "INVARIANT", "VALUE", "UNIT", "SOURCE")
	names := make([]string, 0)
	bySystem := map[string]*generators.System{}
	for _, s := range all {
		names = append(names, s.Name)
		bySystem[s.Name] = s
	}
	sort.Strings(names)
	for _, n := range names {
		for _, v := range bySystem[n].Invariants {
			t.row(n, v.Name, human(v.Value), v.Unit, v.Source)
		}
	}
	return t.flush()
}
