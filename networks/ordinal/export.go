package ordinal

import (
	"bufio"
	"fmt"
	"io"
	"strconv"

	"github.com/tracesift/tracesift/features/ordinal"
)

// PatternString writes the pattern of node i as its ranks, e.g. "0213"
// (0 = smallest sample of the window; orders up to 7 need one digit each).
func (nw *Network) PatternString(i int) string {
	r, err := ordinal.Pattern(int(nw.Patterns[i]), nw.Order)
	if err != nil {
		return "?"
	}
	b := make([]byte, len(r))
	for k, v := range r {
		b[k] = byte('0' + v)
	}
	return string(b)
}

// WriteEdgeList writes the directed weighted transitions as CSV: the
// header "source,target,weight,source_pattern,target_pattern", then one
// line per transition (self-loops included), sorted by source then target;
// nodes are zero-based indices, patterns their ranks (PatternString).
func WriteEdgeList(w io.Writer, nw *Network) error {
	bw := bufio.NewWriter(w)
	bw.WriteString("source,target,weight,source_pattern,target_pattern\n")
	line := make([]byte, 0, 64)
	for i := 0; i < nw.Len(); i++ {
		js, ws := nw.Successors(i)
		for k, j := range js {
			line = strconv.AppendInt(line[:0], int64(i), 10)
			line = append(line, ',')
			line = strconv.AppendInt(line, int64(j), 10)
			line = append(line, ',')
			line = strconv.AppendInt(line, ws[k], 10)
			line = append(line, ',')
			line = append(line, nw.PatternString(i)...)
			line = append(line, ',')
			line = append(line, nw.PatternString(int(j))...)
			line = append(line, '\n')
			if _, err := bw.Write(line); err != nil {
				return fmt.Errorf("edge list: %w", err)
			}
		}
	}
	if err := bw.Flush(); err != nil {
		return fmt.Errorf("edge list: %w", err)
	}
	return nil
}

// WriteGraphML writes the network as a directed GraphML graph: nodes
// n0.. with the attributes "pattern" (ranks, string) and "count" (windows,
// long), edges with the attribute "weight" (transitions, long), self-loops
// included.
func WriteGraphML(w io.Writer, nw *Network) error {
	bw := bufio.NewWriter(w)
	bw.WriteString(`<?xml version="1.0" encoding="UTF-8"?>` + "\n")
	bw.WriteString(`<graphml xmlns="http://graphml.graphdrawing.org/xmlns" xmlns:xsi="http://www.w3.org/2001/XMLSchema-instance" xsi:schemaLocation="http://graphml.graphdrawing.org/xmlns http://graphml.graphdrawing.org/xmlns/1.0/graphml.xsd">` + "\n")
	bw.WriteString(`  <key id="pattern" for="node" attr.name="pattern" attr.type="string"/>` + "\n")
	bw.WriteString(`  <key id="count" for="node" attr.name="count" attr.type="long"/>` + "\n")
	bw.WriteString(`  <key id="weight" for="edge" attr.name="weight" attr.type="long"/>` + "\n")
	bw.WriteString(`  <graph id="opn" edgedefault="directed">` + "\n")
	for i := 0; i < nw.Len(); i++ {
		fmt.Fprintf(bw, "    <node id=\"n%d\"><data key=\"pattern\">%s</data><data key=\"count\">%d</data></node>\n", i, nw.PatternString(i), nw.Counts[i])
	}
	e := 0
	for i := 0; i < nw.Len(); i++ {
		js, ws := nw.Successors(i)
		for k, j := range js {
			fmt.Fprintf(bw, "    <edge id=\"e%d\" source=\"n%d\" target=\"n%d\"><data key=\"weight\">%d</data></edge>\n", e, i, j, ws[k])
			e++
		}
	}
	bw.WriteString("  </graph>\n</graphml>\n")
	if err := bw.Flush(); err != nil {
		return fmt.Errorf("graphml: %w", err)
	}
	return nil
}
