// The legend beside the 3-D view: what the colours mean in the current colour mode, with the
// quantity's unit. Materials get swatches with their names; strain and actuator level get the
// diverging bar with its end values.
import { h } from '../ui/element.ts';
import type { ColourMode } from './body-view.ts';
import { divergingGradientCss, materialCss, sequentialGradientCss } from './colour-scale.ts';

/** `errorLimitM`: the error at the dark end of the scale in 'error' mode, m. */
export function renderColourLegend(host: HTMLElement, mode: ColourMode, materialNames: string[], strainLimit: number, errorLimitM = 0, materialCount = materialNames.length): void {
  host.replaceChildren();
  host.setAttribute('data-mode', mode);
  if (mode === 'error') {
    const bar = h('div', { className: 'legend-bar' });
    bar.style.background = sequentialGradientCss();
    host.append(
      h('div', { className: 'legend-title', text: 'Prediction error |p̂ − p| per node, m' }),
      bar,
      h('div', { className: 'legend-ends' }, h('span', { text: '0' }), h('span', { text: `${Number(errorLimitM.toPrecision(3))} m (largest in the episode)` })),
      h('ul', { className: 'legend-swatches' }, swatchItem('rgb(107, 116, 128)', 'recorded motion (grey outline)')),
    );
    return;
  }
  if (mode === 'material') {
    host.append(h('div', { className: 'legend-title', text: 'Material' }));
    const names = materialNames.length > 0 ? materialNames : [];
    const list = h('ul', { className: 'legend-swatches' });
    names.forEach((name, index) => list.append(swatchItem(materialCss(index, Math.max(materialCount, names.length)), name)));
    if (names.length === 0) list.append(swatchItem(materialCss(-1, 1), 'one material (chain)'));
    list.append(swatchItem('rgb(38, 38, 46)', 'pinned or driven node'));
    host.append(list);
    return;
  }
  const isStrain = mode === 'strain';
  const limitText = isStrain ? `${formatPercent(strainLimit)}` : '1';
  host.append(
    h('div', { className: 'legend-title', text: isStrain ? 'Strain (L − L₀)/L₀, %' : 'Actuator level u, 1 (dimensionless)' }),
    gradientBar(),
    h(
      'div',
      { className: 'legend-ends' },
      h('span', { text: `−${limitText}${isStrain ? ' %' : ''} ${isStrain ? 'compressed' : 'contract'}` }),
      h('span', { text: '0' }),
      h('span', { text: `+${limitText}${isStrain ? ' %' : ''} ${isStrain ? 'stretched' : 'expand'}` }),
    ),
  );
}

function swatchItem(css: string, name: string): HTMLLIElement {
  const swatch = h('span', { className: 'swatch' });
  swatch.style.background = css;
  return h('li', {}, swatch, h('span', { text: name }));
}

function gradientBar(): HTMLElement {
  const bar = h('div', { className: 'legend-bar' });
  bar.style.background = divergingGradientCss();
  return bar;
}

function formatPercent(fraction: number): string {
  const percent = fraction * 100;
  return percent >= 1 ? percent.toFixed(0) : percent.toPrecision(2);
}
