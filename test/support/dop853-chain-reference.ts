// SciPy's DOP853 (solve_ivp, rtol = atol = 1e-12; Hairer, Nørsett & Wanner, Solving ODEs I;
// SciPy documentation) run in Debian's /usr/bin/python3 on a mass-spring model given only as
// data. The Python side writes the force law itself from the textbook definitions: gravity
// m·g and per spring a Kelvin–Voigt element, tension k·(L − L0) + c·(relative velocity along
// the axis) (e.g. Rao, Mechanical Vibrations). Pinned nodes stay where they are.
import type { Model } from '../../sim/core/model.ts';
import type { World } from '../../sim/core/world.ts';

export const DOP853_CHAIN_SCRIPT = String.raw`
import sys, json
import numpy as np
from scipy.integrate import solve_ivp

d = json.load(sys.stdin)
x0 = np.array(d['positionM'], dtype=float).reshape(-1, 3)
v0 = np.array(d['velocityMPerS'], dtype=float).reshape(-1, 3)
m = np.array(d['massKg'], dtype=float)
free = np.array(d['free'], dtype=bool)
a = np.array(d['springA'], dtype=int)
b = np.array(d['springB'], dtype=int)
k = np.array(d['stiffnessNPerM'], dtype=float)
c = np.array(d['dampingNsPerM'], dtype=float)
rest = np.array(d['restLengthM'], dtype=float)
g = np.array(d['gravityMPerS2'], dtype=float)
n = len(m)

def rhs(t, y):
    x = y[:3 * n].reshape(n, 3)
    v = y[3 * n:].reshape(n, 3)
    axis = x[b] - x[a]
    length = np.linalg.norm(axis, axis=1)
    unit = axis / length[:, None]
    # Kelvin-Voigt spring: tension from stretch plus dashpot on the stretching rate.
    tension = k * (length - rest) + c * np.einsum('ij,ij->i', v[b] - v[a], unit)
    force = m[:, None] * g
    np.add.at(force, a, tension[:, None] * unit)
    np.add.at(force, b, -tension[:, None] * unit)
    acc = force / m[:, None]
    acc[~free] = 0.0
    vel = v.copy()
    vel[~free] = 0.0
    return np.concatenate([vel.ravel(), acc.ravel()])

times = np.array(d['timesS'], dtype=float)
sol = solve_ivp(rhs, (0.0, times[-1]), np.concatenate([x0.ravel(), v0.ravel()]), method='DOP853',
                rtol=1e-12, atol=1e-12, t_eval=times)
print(json.dumps({'status': int(sol.status), 'nfev': int(sol.nfev),
                  'positionM': sol.y[:3 * n].T.tolist()}))
`;

export interface ChainReferenceResult {
  status: number;
  nfev: number;
  positionM: number[][];
}

/** The script's input for a model at its current state, with the times to report. */
export function chainReferenceInput(model: Model, world: World, timesS: number[]): unknown {
  return {
    positionM: Array.from(model.positionM),
    velocityMPerS: Array.from(model.velocityMPerS),
    massKg: Array.from(model.massKg),
    free: Array.from(model.inverseMassPerKg, (w) => w > 0),
    springA: Array.from(model.springNodeA),
    springB: Array.from(model.springNodeB),
    stiffnessNPerM: Array.from(model.stiffnessNPerM),
    dampingNsPerM: Array.from(model.dampingNsPerM),
    restLengthM: Array.from(model.restLengthM),
    gravityMPerS2: world.gravityMPerS2,
    timesS,
  };
}
