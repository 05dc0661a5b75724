// The two balances of an episode, from one row of `energies` and one row of `energy_flows`
// against the first row of `energies`:
//
//   work balance   r_w = ΔKE − Σ conservative work − Σ input work + Σ dissipated
//   energy balance r_e = ΔKE + Σ ΔU_potential − Σ input work + Σ dissipated
//
// r_w closes to rounding by construction of the ledger (step-ledger.ts): it checks the books.
// r_e is what a learner cares about: the energy semi-implicit Euler itself created, because
// each potential's change differs from its force's work along the discrete path by an O(dt)
// amount (the modified-energy picture of Hairer, Lubich & Wanner, Geometric Numerical
// Integration, 2nd ed., ch. IX). Support kinetic energy enters neither balance.
import { ENERGY_TERMS } from './energy.ts';
import { FLOW_COLUMNS } from './energy-flows.ts';

export interface BalanceResiduals {
  workJ: number;
  energyJ: number;
}

export function balanceResiduals(energies: Float64Array, startRow: number, row: number, flows: Float64Array, flowRow: number, out: BalanceResiduals): BalanceResiduals {
  const e = ENERGY_TERMS.length;
  let kinetic = 0;
  let potential = 0;
  for (let t = 0; t < e; t++) {
    const change = energies[row * e + t] - energies[startRow * e + t];
    if (ENERGY_TERMS[t].role === 'kinetic') kinetic += change;
    else if (ENERGY_TERMS[t].role === 'potential') potential += change;
  }
  const f = FLOW_COLUMNS.length;
  let conservative = 0;
  let input = 0;
  let dissipated = 0;
  for (let c = 0; c < f; c++) {
    const value = flows[flowRow * f + c];
    const role = FLOW_COLUMNS[c].role;
    if (role === 'conservative') conservative += value;
    else if (role === 'input') input += value;
    else dissipated += value;
  }
  out.workJ = kinetic - conservative - input + dissipated;
  out.energyJ = kinetic + potential - input + dissipated;
  return out;
}
