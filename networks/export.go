package networks

import (
	"bufio"
	"fmt"
	"io"
	"math"
	"strconv"
)

// WriteEdgeList writes g as CSV: the header "source,target", then one line
// per undirected edge with zero-based node indices, source < target, sorted
// by source then target. It streams through a buffered writer, so a
// 10^6-node graph needs no more memory than the graph itself.
func WriteEdgeList(w io.Writer, g *Graph) error {
	bw := bufio.NewWriterSize(w, 1<<16)
	bw.WriteString("source,target\n")
	line := make([]byte, 0, 32)
	for i := 0; i < g.Len(); i++ {
		for _, j := range g.Successors(i) {
			line = strconv.AppendInt(line[:0], int64(i), 10)
			line = append(line, ',')
			line = strconv.AppendInt(line, int64(j), 10)
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

// WriteGraphML writes g as GraphML (http://graphml.graphdrawing.org): an
// undirected graph with nodes n0..n{N−1} and edges e0.. with source < target.
// If values is non-nil it must have one entry per node and is written as the
// node attribute "value" (type double), e.g. the sample each node stands
// for; non-finite values are written as NaN/INF/-INF as XML Schema spells
// them. Streams like WriteEdgeList.
func WriteGraphML(w io.Writer, g *Graph, values []float64) error {
	if values != nil && len(values) != g.Len() {
		return fmt.Errorf("graphml: %d values for %d nodes", len(values), g.Len())
	}
	bw := bufio.NewWriterSize(w, 1<<16)
	bw.WriteString(`<?xml version="1.0" encoding="UTF-8"?>` + "\n")
	bw.WriteString(`<graphml xmlns="http://graphml.graphdrawing.org/xmlns" xmlns:xsi="http://www.w3.org/2001/XMLSchema-instance" xsi:schemaLocation="http://graphml.graphdrawing.org/xmlns http://graphml.graphdrawing.org/xmlns/1.0/graphml.xsd">` + "\n")
	if values != nil {
		bw.WriteString(`  <key id="value" for="node" attr.name="value" attr.type="double"/>` + "\n")
	}
	fmt.Fprintf(bw, "  <graph id=\"%s\" edgedefault=\"undirected\">\n", g.Kind())
	line := make([]byte, 0, 96)
	for i := 0; i < g.Len(); i++ {
		line = append(line[:0], `    <node id="n`...)
		line = strconv.AppendInt(line, int64(i), 10)
		if values != nil {
			line = append(line, `"><data key="value">`...)
			line = appendXSDouble(line, values[i])
			line = append(line, "</data></node>\n"...)
		} else {
			line = append(line, "\"/>\n"...)
		}
		if _, err := bw.Write(line); err != nil {
			return fmt.Errorf("graphml: %w", err)
		}
	}
	var e int64
	for i := 0; i < g.Len(); i++ {
		for _, j := range g.Successors(i) {
			line = append(line[:0], `    <edge id="e`...)
			line = strconv.AppendInt(line, e, 10)
			line = append(line, `" source="n`...)
			line = strconv.AppendInt(line, int64(i), 10)
			line = append(line, `" target="n`...)
			line = strconv.AppendInt(line, int64(j), 10)
			line = append(line, "\"/>\n"...)
			if _, err := bw.Write(line); err != nil {
				return fmt.Errorf("graphml: %w", err)
			}
			e++
		}
	}
	bw.WriteString("  </graph>\n</graphml>\n")
	if err := bw.Flush(); err != nil {
		return fmt.Errorf("graphml: %w", err)
	}
	return nil
}

// appendXSDouble appends v in the lexical form of xsd:double.
func appendXSDouble(b []byte, v float64) []byte {
	switch {
	case math.IsNaN(v):
		return append(b, "NaN"...)
	case math.IsInf(v, 1):
		return append(b, "INF"...)
	case math.IsInf(v, -1):
		return append(b, "-INF"...)
	}
	return strconv.AppendFloat(b, v, 'g', -1, 64)
}
