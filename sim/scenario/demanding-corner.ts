// The parameter resolver of the checks: every value at one end of its range, chosen so that the
// resulting system is the stiffest, lightest and largest ('demanding') or the opposite
// ('gentle') that the scenario can produce; it also lists every parameter it was asked for.
import type { NumericValueSpec } from '../random/distribution.ts';
import { isConstant, specBounds } from '../random/distribution.ts';
import type { DemandingEnd, ParameterResolver } from './parameter-resolver.ts';

export interface ParameterSite {
  pointer: string;
  spec: NumericValueSpec;
  demanding: DemandingEnd;
  /** The value this corner used. */
  value: number;
}

export class DemandingCorner implements ParameterResolver {
  readonly sites: ParameterSite[] = [];

  constructor(private readonly corner: 'demanding' | 'gentle' = 'demanding') {}

  value(spec: NumericValueSpec, pointer: string, demanding: DemandingEnd): number {
    const bounds = specBounds(spec);
    let value: number;
    if (demanding === 'none') {
      // Any possible value will do; the larger in magnitude avoids a zero direction vector.
      value = Math.abs(bounds.max) >= Math.abs(bounds.min) ? bounds.max : bounds.min;
    } else {
      const high = (demanding === 'high') === (this.corner === 'demanding');
      value = high ? bounds.max : bounds.min;
    }
    this.sites.push({ pointer, spec, demanding, value });
    return value;
  }

  /** The sites whose value differs between episodes. */
  sampledSites(): ParameterSite[] {
    return this.sites.filter((site) => !isConstant(site.spec));
  }
}
