// Our own categorical palette for every chart: eight hues far apart in lightness and hue,
// readable on white. Series (or splits) take them in order.
export const CHART_COLOURS = ['#1f5f8b', '#c8553d', '#2e8b57', '#8e5ea2', '#b8860b', '#3a3a3a', '#d4447c', '#4f9da6'];

export function chartColour(index: number): string {
  return CHART_COLOURS[index % CHART_COLOURS.length];
}
