// The chain's bending model against SciPy in Debian's /usr/bin/python3:
// - trajectory: a 4-part clamped chain with bending, its damping, springs and gravity,
//   integrated by scipy.integrate.solve_ivp (DOP853, rtol 1e-11) from equations written
//   afresh in Python: bending and clamp forces as complex-step derivatives (Squire & Trapp,
//   SIAM Review 40, 1998) of E = k·(1 − cos φ), damping −η·(∇|w|·v)·∇|w| from the Rayleigh
//   function ½·η·(d|w|/dt)², Hooke springs with axial damping. Our semi-implicit Euler must
//   agree to its own first-order error: halving dt halves the difference.
// - hanging chain with bending rigidity: the Euler–Bernoulli beam under its own weight's
//   tension, EI·y'''' − (T·y')' = ρA·ω²·y with T = ρA·g·(L − s), pinned top (y = y'' = 0) and
//   free end (y'' = y''' = 0) (the heavy hanging beam; e.g. Meirovitch, Fundamentals of
//   Vibrations, strings and beams under axial force; from memory), solved as an eigenvalue
//   boundary-value problem by scipy.integrate.solve_bvp, against the eigenfrequencies of our
//   chain linearised about its hanging equilibrium (scipy.linalg.eigh). With EI → 0 this is the
//   hanging chain, ω₁ = (2.4048/2)·√(g/L) (Bernoulli/Euler; J₀'s first zero, from memory).
// - stability bound: block Gershgorin with hinges stays above the true ω_max (scipy.linalg.eigh
//   of the finite-difference stiffness at a bent pose) and within a factor 2 of it.
import { beforeAll, describe, expect, it } from 'vitest';

import { accumulateBendingForces, accumulateClampForces } from '../sim/core/bending-forces.ts';
import { writeBodyForces } from '../sim/core/body-forces.ts';
import type { Model } from '../sim/core/model.ts';
import { accumulateSpringForces } from '../sim/core/spring-forces.ts';
import { stabilityBound } from '../sim/core/stability-bound.ts';
import type { World } from '../sim/core/world.ts';
import { defaultWorld } from '../sim/core/world.ts';
import { recordTrajectory } from '../sim/episode/record-episode.ts';
import type { ChainParameters } from '../sim/systems/chain.ts';
import { buildChain } from '../sim/systems/chain.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const python = referencePythonAvailability();

function chain(overrides: Partial<ChainParameters>): ChainParameters {
  return {
    partCount: 4, lengthM: 0.4, totalMassKg: 0.04, axialStiffnessN: 200, secondNeighbourSpringRatio: 0,
    bendingStiffnessNm2: 0.02, bendingDampingRatio: 0.1, dampingRatio: 0.05, diameterM: 0.01, anchor: 'free', clampedEnds: ['top'],
    originM: [0, 0, 0], directionUnit: [1, 0, 0], forceHandles: [], forceAxes: [], drivenAxes: [], ...overrides,
  };
}

const IVP_SCRIPT = String.raw`
import sys, json
import numpy as np
from scipy.integrate import solve_ivp

d = json.load(sys.stdin)
n = d['nodeCount']
x0 = np.array(d['positionM'], dtype=float)
m = np.array(d['massKg'], dtype=float)
free = np.array(d['free'], dtype=bool)
g = np.array(d['gravity'], dtype=float)
springs = d['springs']          # [a, b, k, c, rest]
hinges = d['hinges']            # [p, mid, nxt, k, eta]
clamps = d['clamps']            # [a, b, dx, dy, dz, k, eta]

def unit(e):
    return e / np.sqrt(np.sum(e * e))

def hinge_w(X, h):
    p, mid, nxt = int(h[0]), int(h[1]), int(h[2])
    return unit(X[nxt] - X[mid]) - unit(X[mid] - X[p])

def clamp_w(X, q):
    a, b = int(q[0]), int(q[1])
    return unit(X[b] - X[a]) - np.array(q[2:5])

def grad(fun, X):
    # Complex step: exact derivatives of an analytic function to rounding.
    out = np.zeros(X.shape)
    for i in range(X.shape[0]):
        for k in range(3):
            Z = X.astype(complex)
            Z[i, k] += 1e-30j
            out[i, k] = fun(Z).imag / 1e-30
    return out

def rhs(t, y):
    X = y[:3 * n].reshape(n, 3)
    V = y[3 * n:].reshape(n, 3)
    F = m[:, None] * g[None, :]
    for a, b, k, c, rest in springs:
        a, b = int(a), int(b)
        e = X[b] - X[a]
        L = np.linalg.norm(e)
        u = e / L
        f = k * (L - rest) + c * np.dot(V[b] - V[a], u)
        F[a] += f * u
        F[b] -= f * u
    for terms, wfun in ((hinges, hinge_w), (clamps, clamp_w)):
        for h in terms:
            k, eta = h[-2], h[-1]
            F -= grad(lambda Z: 0.5 * k * np.sum(wfun(Z, h) ** 2), X)
            if eta > 0:
                G = grad(lambda Z: np.sqrt(np.sum(wfun(Z, h) ** 2)), X)
                F -= eta * np.sum(G * V) * G
    A = np.where(free[:, None], F / m[:, None], 0.0)
    Vf = np.where(free[:, None], V, 0.0)
    return np.concatenate([Vf.ravel(), A.ravel()])

y0 = np.concatenate([x0, np.array(d['velocityMPerS'], dtype=float)])
times = np.array(d['times'])
sol = solve_ivp(rhs, (0, times[-1]), y0, method='DOP853', rtol=1e-11, atol=1e-13, t_eval=times)
print(json.dumps({'status': int(sol.status), 'positions': sol.y[:3 * n].T.tolist()}))
`;

function ivpInput(model: Model, world: World, times: number[]): unknown {
  const springs = [];
  for (let s = 0; s < model.springCount; s++) springs.push([model.springNodeA[s], model.springNodeB[s], model.stiffnessNPerM[s], model.dampingNsPerM[s], model.restLengthM[s]]);
  const hinges = [];
  for (let h = 0; h < model.hingeCount; h++) hinges.push([...model.hingeNodes.subarray(3 * h, 3 * h + 3), model.hingeStiffnessNm[h], model.hingeDampingNms[h]]);
  const clamps = [];
  for (let q = 0; q < model.clampCount; q++) clamps.push([...model.clampNodes.subarray(2 * q, 2 * q + 2), ...model.clampDirectionUnit.subarray(3 * q, 3 * q + 3), model.clampStiffnessNm[q], model.clampDampingNms[q]]);
  return {
    nodeCount: model.nodeCount, positionM: Array.from(model.positionM), velocityMPerS: Array.from(model.velocityMPerS), massKg: Array.from(model.massKg),
    free: Array.from(model.inverseMassPerKg, (w) => w > 0), gravity: world.gravityMPerS2, springs, hinges, clamps, times,
  };
}

describe.skipIf(!python.available)('bending chain trajectory against scipy.integrate.solve_ivp (DOP853)', () => {
  const intervalS = 0.01;
  const steps = 30;
  let reference: number[][];
  const start = buildChain(chain({})).model;
  // Start bent in 3-D and moving, so every force and both dampings act.
  for (let i = 1; i < start.nodeCount; i++) {
    start.positionM[3 * i + 2] += 0.004 * i * i;
    start.velocityMPerS[3 * i + 1] = 0.05 * i;
  }
  const world = defaultWorld();

  beforeAll(() => {
    const times = Array.from({ length: steps + 1 }, (_, t) => t * intervalS);
    const result = runReferencePython<{ status: number; positions: number[][] }>(IVP_SCRIPT, ivpInput(start, world, times));
    expect(result.status).toBe(0);
    reference = result.positions;
  });

  function largestDifferenceM(substeps: number): number {
    const model = { ...start, positionM: start.positionM.slice(), velocityMPerS: start.velocityMPerS.slice() };
    const trajectory = recordTrajectory(model, world, new Float64Array(0), { recordIntervalS: intervalS, recordedSteps: steps, substeps });
    let worst = 0;
    for (let t = 0; t <= steps; t++) {
      for (let j = 0; j < 3 * model.nodeCount; j++) worst = Math.max(worst, Math.abs(trajectory.positionM[t * 3 * model.nodeCount + j] - reference[t][j]));
    }
    return worst;
  }

  it('0.3 s of a swinging, twisting clamped chain: within 0.1 mm at dt = 10 µs, and first order (halving dt halves the gap)', () => {
    const coarse = largestDifferenceM(1000);
    const fine = largestDifferenceM(2000);
    expect(coarse).toBeLessThan(1e-4);
    expect(coarse / fine).toBeGreaterThan(1.8);
    expect(coarse / fine).toBeLessThan(2.2);
  });
});

const HANGING_SCRIPT = String.raw`
import sys, json
import numpy as np
from scipy.integrate import solve_bvp
from scipy.linalg import eigh

d = json.load(sys.stdin)
L, rhoA, g = d['lengthM'], d['massPerLengthKgPerM'], d['gravity']
out = []
for case in d['cases']:
    EI = case['EI']
    # Our chain: generalised eigenproblem K v = w^2 M v of the transverse stiffness.
    K = np.array(case['K'])
    K = 0.5 * (K + K.T)
    M = np.diag(case['mass'])
    ours = np.sqrt(np.abs(eigh(K, M, eigvals_only=True)))[:3]
    # Initial guesses (which eigenpair solve_bvp refines) from a fine finite-difference beam:
    # N = 400 segments, energy ½·EI·Σ(second difference / h²)²·h + ½·Σ T·(difference / h)²·h.
    N = 400
    h = L / N
    D1 = np.zeros((N, N))   # (y_{i+1} - y_i)/h for i = 0..N-1, y_0 = 0 at the top
    for i in range(N):
        D1[i, i] = 1 / h
        if i > 0: D1[i, i - 1] = -1 / h
    D2 = np.zeros((N - 1, N))  # second differences at interior nodes 1..N-1
    for i in range(1, N):
        D2[i - 1, i - 1] += -2 / h**2
        D2[i - 1, i] += 1 / h**2
        if i >= 2: D2[i - 1, i - 2] += 1 / h**2
    Tmid = rhoA * g * (L - (np.arange(N) + 0.5) * h)
    Kfd = EI * h * D2.T @ D2 + h * D1.T @ np.diag(Tmid) @ D1
    Mfd = np.eye(N) * rhoA * h
    Mfd[-1, -1] *= 0.5
    wfd, vfd = eigh(Kfd, Mfd)
    s = np.arange(1, N + 1) * h
    refs = []
    for mode in range(3):
        lam0 = wfd[mode]
        grid = np.linspace(0, L, 401)
        yg = np.interp(grid, np.concatenate([[0], s]), np.concatenate([[0], vfd[:, mode]]))
        slope = np.gradient(yg, grid)
        yg = yg / slope[0]
        guess = np.vstack([yg, np.gradient(yg, grid), np.gradient(np.gradient(yg, grid), grid), np.gradient(np.gradient(np.gradient(yg, grid), grid), grid)])
        def f(x, y, p):
            T = rhoA * g * (L - x)
            return np.vstack([y[1], y[2], y[3], (T * y[2] - rhoA * g * y[1] + rhoA * p[0] * y[0]) / EI])
        def bc(ya, yb, p):
            return np.array([ya[0], ya[2], ya[1] - 1.0, yb[2], yb[3]])
        sol = solve_bvp(f, bc, grid, guess, p=[lam0], tol=1e-8, max_nodes=200000)
        refs.append({'status': int(sol.status), 'omega': float(np.sqrt(sol.p[0])), 'fd': float(np.sqrt(lam0))})
    out.append({'ours': ours.tolist(), 'reference': refs})
print(json.dumps(out))
`;

/** Transverse (x) stiffness of the free nodes by central differences of the model's forces. */
function transverseStiffness(model: Model, world: World): { K: number[][]; mass: number[] } {
  const freeNodes: number[] = [];
  for (let i = 0; i < model.nodeCount; i++) if (model.inverseMassPerKg[i] > 0) freeNodes.push(i);
  const f = new Float64Array(3 * model.nodeCount);
  const force = (): Float64Array => {
    writeBodyForces(model, world, f);
    accumulateSpringForces(model, f);
    accumulateBendingForces(model, f);
    accumulateClampForces(model, f);
    return f;
  };
  const h = 1e-7;
  const K = freeNodes.map(() => new Array<number>(freeNodes.length).fill(0));
  freeNodes.forEach((j, column) => {
    const keep = model.positionM[3 * j];
    model.positionM[3 * j] = keep + h;
    const up = Float64Array.from(force());
    model.positionM[3 * j] = keep - h;
    const down = Float64Array.from(force());
    model.positionM[3 * j] = keep;
    freeNodes.forEach((i, row) => {
      K[row][column] = -(up[3 * i] - down[3 * i]) / (2 * h);
    });
  });
  return { K, mass: freeNodes.map((i) => model.massKg[i]) };
}

describe.skipIf(!python.available)('hanging chain with bending rigidity against the heavy hanging beam (scipy.integrate.solve_bvp)', () => {
  const lengthM = 2;
  const totalMassKg = 1.5;
  const parts = 40;
  const rigidities = [0.05, 0.5, 5];
  let results: { ours: number[]; reference: { status: number; omega: number; fd: number }[] }[];

  beforeAll(() => {
    const world = defaultWorld();
    const cases = rigidities.map((EI) => {
      const model = buildChain(chain({ partCount: parts, lengthM, totalMassKg, axialStiffnessN: 1e6, bendingStiffnessNm2: EI, anchor: 'top-pinned', clampedEnds: [], directionUnit: [0, -1, 0], bendingDampingRatio: 0, dampingRatio: 0 })).model;
      // Static equilibrium: segment j stretched by the weight below it over k (Hooke's law).
      const k = model.stiffnessNPerM[0];
      let y = 0;
      for (let j = 0; j < parts; j++) {
        let below = 0;
        for (let i = j + 1; i <= parts; i++) below += model.massKg[i];
        y -= lengthM / parts + (below * 9.81) / k;
        model.positionM[3 * (j + 1) + 1] = y;
      }
      return { EI, ...transverseStiffness(model, world) };
    });
    results = runReferencePython(HANGING_SCRIPT, { lengthM, massPerLengthKgPerM: totalMassKg / lengthM, gravity: 9.81, cases });
  });

  it('solve_bvp converged for every mode', () => {
    for (const r of results) for (const mode of r.reference) expect(mode.status).toBe(0);
  });

  it('first three frequencies of the 40-part chain within 0.5% of the beam theory (0.02–0.4% measured), for EI = 0.05, 0.5 and 5 N·m²', () => {
    for (const r of results) {
      for (let mode = 0; mode < 3; mode++) expect(Math.abs(r.ours[mode] / r.reference[mode].omega - 1)).toBeLessThan(0.005);
    }
  });

  it('frequencies rise with EI (the chain stiffens), from near the hanging chain ω₁ = 1.2024·√(g/L)', () => {
    const chainOmega = 1.2024 * Math.sqrt(9.81 / lengthM);
    expect(Math.abs(results[0].reference[0].omega / chainOmega - 1)).toBeLessThan(0.05);
    for (let mode = 0; mode < 3; mode++) {
      expect(results[1].ours[mode]).toBeGreaterThan(results[0].ours[mode]);
      expect(results[2].ours[mode]).toBeGreaterThan(results[1].ours[mode]);
    }
  });
});

const EIGH_SCRIPT = String.raw`
import sys, json
import numpy as np
from scipy.linalg import eigh
d = json.load(sys.stdin)
K = np.array(d['K']); K = 0.5 * (K + K.T)
M = np.diag(np.repeat(d['mass'], 3))
w = eigh(K, M, eigvals_only=True)
print(json.dumps(float(np.sqrt(max(w[-1], 0.0)))))
`;

describe.skipIf(!python.available)('stability bound with bending hinges and a clamp (block Gershgorin vs scipy.linalg.eigh)', () => {
  it('a bent 12-part chain with EI dominating: true ω_max ≤ bound ≤ 2·true', () => {
    const model = buildChain(chain({ partCount: 12, lengthM: 0.6, totalMassKg: 0.06, axialStiffnessN: 5, bendingStiffnessNm2: 0.05, secondNeighbourSpringRatio: 0 })).model;
    for (let i = 1; i < model.nodeCount; i++) model.positionM[3 * i + 1] += 0.002 * i * i;
    const world = defaultWorld();
    world.gravityMPerS2 = [0, 0, 0];
    const freeNodes: number[] = [];
    for (let i = 0; i < model.nodeCount; i++) if (model.inverseMassPerKg[i] > 0) freeNodes.push(i);
    const f = new Float64Array(3 * model.nodeCount);
    const force = (): Float64Array => {
      writeBodyForces(model, world, f);
      accumulateSpringForces(model, f);
      accumulateBendingForces(model, f);
      accumulateClampForces(model, f);
      return Float64Array.from(f);
    };
    const dofs = freeNodes.flatMap((i) => [3 * i, 3 * i + 1, 3 * i + 2]);
    const h = 1e-7;
    const K = dofs.map(() => new Array<number>(dofs.length).fill(0));
    dofs.forEach((j, column) => {
      const keep = model.positionM[j];
      model.positionM[j] = keep + h;
      const up = force();
      model.positionM[j] = keep - h;
      const down = force();
      model.positionM[j] = keep;
      dofs.forEach((i, row) => (K[row][column] = -(up[i] - down[i]) / (2 * h)));
    });
    const trueOmega = runReferencePython<number>(EIGH_SCRIPT, { K, mass: freeNodes.map((i) => model.massKg[i]) });
    const bound = stabilityBound(model).omegaMaxRadPerS;
    expect(bound).toBeGreaterThanOrEqual(trueOmega);
    expect(bound).toBeLessThanOrEqual(2 * trueOmega);
  });
});
