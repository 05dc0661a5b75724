// The report charts: well-formed SVG as Python's standard-library XML parser reads it, data
// mapped linearly (or by decade) onto the plot box, gaps at non-finite values, and the same
// input giving the same bytes. Tick values follow the 1-2-5 rule (common practice, no source).
import { describe, expect, it } from 'vitest';

import { decadeTicks, niceTicks } from '../sim/plots/nice-ticks.ts';
import { renderLineChart } from '../sim/plots/svg-line-chart.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const python = referencePythonAvailability();

describe('axis ticks (1-2-5 rule, common practice, no source)', () => {
  it('covers the range with round steps', () => {
    expect(niceTicks(0, 0.93).values).toEqual([0, 0.2, 0.4, 0.6, 0.8, 1]);
    expect(niceTicks(3, 47).values).toEqual([0, 10, 20, 30, 40, 50]);
    expect(niceTicks(-0.013, 0.012).values).toEqual([-0.015, -0.01, -0.005, 0, 0.005, 0.01, 0.015]);
  });
  it('widens a flat range and takes decades for a log axis', () => {
    expect(niceTicks(2, 2).min).toBeLessThan(2);
    expect(niceTicks(2, 2).max).toBeGreaterThan(2);
    expect(decadeTicks(0.0031, 0.45).values).toEqual([0.001, 0.01, 0.1, 1]);
  });
});

describe('SVG line chart', () => {
  const spec = {
    title: 'Position error <test> & more',
    xLabel: 'horizon step',
    yLabel: 'RMSE, m',
    series: [
      { name: 'test', x: [0, 1, 2, 3, 4], y: [0, 0.25, Number.NaN, 0.75, 1] },
      { name: 'held-out', x: [0, 2, 4], y: [0, 0.5, 1], style: 'points' as const },
    ],
    guides: [{ y: 0.5, label: 'threshold' }],
  };

  it('gives the same bytes for the same input', () => {
    expect(renderLineChart(spec)).toBe(renderLineChart(structuredClone(spec)));
  });

  it.runIf(python.available)('parses as XML (Python xml.etree) with the data mapped linearly onto the plot box', () => {
    const svg = renderLineChart(spec);
    const read = runReferencePython<{ root: string; pieces: string[][]; circles: number[][]; texts: string[] }>(`
import sys, json, re, xml.etree.ElementTree as ET
svg = json.load(sys.stdin)
root = ET.fromstring(svg)
ns = '{http://www.w3.org/2000/svg}'
paths = [p.get('d') for p in root.iter(ns + 'path')]
pieces = [re.findall(r'[ML][^ML]+', d) for d in paths]
circles = [[float(c.get('cx')), float(c.get('cy'))] for c in root.iter(ns + 'circle')]
texts = [t.text for t in root.iter(ns + 'text')]
print(json.dumps({'root': root.tag, 'pieces': pieces, 'circles': circles, 'texts': texts}))
`, svg);
    expect(read.root).toBe('{http://www.w3.org/2000/svg}svg');
    expect(read.texts).toContain('Position error <test> & more');
    // The NaN at x = 2 splits the first series into two pieces: M…L… and M…L….
    expect(read.pieces[0].map((p) => p[0])).toEqual(['M', 'L', 'M', 'L']);
    const points = read.pieces[0].map((p) => p.slice(1).trim().split(' ').map(Number));
    // Equal steps in x and y give equal steps on the page (linear axes).
    const dx = points[1][0] - points[0][0];
    expect(points[3][0] - points[2][0]).toBeCloseTo(dx, 1);
    expect(points[1][1] - points[0][1]).toBeCloseTo(points[3][1] - points[2][1], 1);
    expect(points[1][1]).toBeLessThan(points[0][1]); // larger y is higher on the page
    // The held-out points lie on the same mapping: x = 2 halfway between x = 0 and x = 4.
    expect(read.circles[1][0]).toBeCloseTo((read.circles[0][0] + read.circles[2][0]) / 2, 1);
  });

  it('draws nothing for non-positive values on a log axis instead of failing', () => {
    const svg = renderLineChart({ ...spec, yScale: 'log', guides: [] });
    expect(svg).toContain('<svg');
    expect(svg).not.toContain('NaN');
    expect(svg).not.toContain('Infinity');
  });
});
