import { describe, expect, it } from 'vitest';
import { projectRoute } from '../../../../shared/runs/route-outline.ts';

describe('projectRoute', () => {
  it('fits a square of equal ground sides at 60° N into a square box (longitude scaled by cos 60° = 0.5)', () => {
    // 0.01° of longitude at 60° N spans the same ground as 0.005° of latitude.
    const outline = projectRoute([60, 60, 60.005, 60.005], [10, 10.01, 10.01, 10], 100, 100, 0);
    const points = outline.lines[0]!.split(' ').map((p) => p.split(',').map(Number));
    const xs = points.map((p) => p[0]!);
    const ys = points.map((p) => p[1]!);
    expect(Math.max(...xs) - Math.min(...xs)).toBeCloseTo(Math.max(...ys) - Math.min(...ys), 0);
    expect(Math.max(...ys) - Math.min(...ys)).toBeCloseTo(100, 0);
  });

  it('draws north up and west on the left', () => {
    const outline = projectRoute([0, 0.01], [0, 0.01], 100, 100, 10);
    expect(outline.start).toEqual({ x: 10, y: 90 });
    expect(outline.end).toEqual({ x: 90, y: 10 });
  });

  it('breaks the line where positions are unknown', () => {
    const outline = projectRoute([0, 0.001, null, 0.002, 0.003], [0, 0.001, null, 0.002, 0.003], 100, 100);
    expect(outline.lines).toHaveLength(2);
    expect(outline.lines[0]!.split(' ')).toHaveLength(2);
  });

  it('ignores non-finite coordinates', () => {
    expect(projectRoute([Number.NaN, 1], [0, Number.POSITIVE_INFINITY], 100, 100)).toEqual({ lines: [], start: null, end: null });
  });

  it('places a single point in the middle', () => {
    const outline = projectRoute([45], [7], 100, 60);
    expect(outline.start).toEqual({ x: 50, y: 30 });
    expect(outline.lines).toEqual(['50,30']);
  });

  it('returns nothing for an empty track', () => {
    expect(projectRoute([], [], 100, 100)).toEqual({ lines: [], start: null, end: null });
  });
});
