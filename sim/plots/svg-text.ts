// How every Pliant chart writes numbers and text into SVG: coordinates rounded to 0.01 px with
// trailing zeros dropped (so the same numbers always give the same bytes on any machine) and
// text escaped for XML. One place, so the charts can never disagree about either.

/** A coordinate or length, rounded to 0.01 px. */
export function svgNumber(value: number): string {
  const text = (Math.round(value * 100) / 100).toFixed(2).replace(/\.?0+$/, '') || '0';
  return text === '-0' ? '0' : text;
}

export function escapeXml(text: string): string {
  return text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}

/** The opening tag of a chart document: white page, sans-serif text, no scripts or external references. */
export function svgOpen(widthPx: number, heightPx: number): string[] {
  return [
    `<svg xmlns="http://www.w3.org/2000/svg" width="${svgNumber(widthPx)}" height="${svgNumber(heightPx)}" viewBox="0 0 ${svgNumber(widthPx)} ${svgNumber(heightPx)}" font-family="sans-serif" font-size="11">`,
    `<rect x="0" y="0" width="${svgNumber(widthPx)}" height="${svgNumber(heightPx)}" fill="#ffffff"/>`,
  ];
}

/** The lines of a chart as one document text ending in a line feed. */
export function svgClose(lines: string[]): string {
  return `${[...lines, '</svg>'].join('\n')}\n`;
}
