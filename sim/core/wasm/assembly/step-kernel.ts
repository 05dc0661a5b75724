// AssemblyScript source of the WebAssembly step kernel: the passes of one semi-implicit Euler
// step, written as the JavaScript kernel writes them (same operations, same order, IEEE f64,
// no fused multiply-add: WebAssembly has none implicitly and Binaryen does not reassociate
// floating point), so both paths round alike and end on the same bits.
// Compiled by `npm run build:wasm` (build/build-step-kernel.mjs); not type-checked by tsc.
//
// Mirrors, one function per JavaScript function (keep this list current):
//   writeBodyForces               sim/core/body-forces.ts       writeBodyForces
//   accumulateSpringForces        sim/core/spring-forces.ts     accumulateSpringForces
//   accumulateBendingForces       sim/core/bending-forces.ts    accumulateBendingForces
//   accumulateClampForces         sim/core/bending-forces.ts    accumulateClampForces
//   accumulateFluidDrag           sim/core/fluid-drag.ts        accumulateFluidDrag
//   accumulateSegmentDrag         sim/core/fluid-drag.ts        accumulateSegmentDrag
//   accumulateQuadDrag            sim/core/fluid-drag.ts        accumulateQuadDrag
//   projectGroundContact          sim/core/ground-contact.ts    projectGroundContact
//   updateVelocities              sim/core/simulator.ts         updateVelocities
//   updatePositions               sim/core/simulator.ts         updatePositions
//   updateVelocitiesAndPositions  sim/core/simulator.ts         updateVelocitiesAndPositions
//   step                          sim/core/simulator.ts         Simulator.step (handle forces inline, as there)
//   advanceInterval               sim/core/simulator.ts         Simulator.advanceInterval
//   placeDrivenNodes              sim/core/simulator.ts         Simulator.placeDrivenNodes
//   advanceSteps                  sim/core/simulator.ts         Simulator.advanceSteps
// Not mirrored (they run in JavaScript once per control interval and write into this module's
// memory): applyActuation, writeHandleForces, writeDrivenTargets (control-application.ts).
//
// Memory: the host imports one linear memory sized for the model and never grown, lays the
// arrays out in it and passes their byte offsets once through the set*Layout functions. Every
// index below is a byte offset; a node's xyz doubles sit at 24·node. The springs' end nodes are
// stored as those byte offsets (24·node, written by the host) rather than node indices, which
// saves two multiplications per spring in the hottest loop; layout changes no arithmetic.

// Node arrays.
let nodeCount: i32 = 0;
let positionM: usize = 0;
let velocityMPerS: usize = 0;
let massKg: usize = 0;
let inverseMassPerKg: usize = 0;
let nodeVolumeM3: usize = 0;
let forceN: usize = 0;
// Springs: one 32-byte record each, {u32 24·nodeA, u32 24·nodeB, f64 rest length m,
// f64 stiffness N/m, f64 damping N·s/m}, so a spring's data is one cache line's worth of
// neighbours instead of five streams.
let springCount: i32 = 0;
let springTable: usize = 0;
// Hinges: one 32-byte record each, {u32 24·previous, u32 24·middle, u32 24·next, u32 unused,
// f64 stiffness N·m, f64 damping N·m·s}.
let hingeCount: i32 = 0;
let hingeTable: usize = 0;
// Clamps: one 48-byte record each, {u32 24·held, u32 24·neighbour, f64 dx, f64 dy, f64 dz
// (the held direction, unit), f64 stiffness N·m, f64 damping N·m·s}.
let clampCount: i32 = 0;
let clampTable: usize = 0;
// Fluid panels.
let panelCount: i32 = 0;
let panelNodeCount: i32 = 0;
let panelNodes: usize = 0;
let panelWidthM: f64 = 0;
// Handles and driven nodes.
let handleCount: i32 = 0;
let handleNodes: usize = 0;
let handleForceN: usize = 0;
let drivenCount: i32 = 0;
let drivenNodes: usize = 0;
let drivenStartM: usize = 0;
let drivenTargetM: usize = 0;
let drivenVelocityMPerS: usize = 0;
// World.
let gravityX: f64 = 0;
let gravityY: f64 = 0;
let gravityZ: f64 = 0;
let airDragPerS: f64 = 0;
let buoyantDensityKgPerM3: f64 = 0;
let groundEnabled: bool = false;
let groundHeightM: f64 = 0;
let staticFriction: f64 = 0;
let kineticFriction: f64 = 0;
let fluidEnabled: bool = false;
let normalDragNsPerM3: f64 = 0;
let tangentialDragNsPerM3: f64 = 0;
let flowX: f64 = 0;
let flowY: f64 = 0;
let flowZ: f64 = 0;

export function setNodeLayout(count: i32, x: usize, v: usize, m: usize, invM: usize, volume: usize, f: usize): void {
  nodeCount = count;
  positionM = x;
  velocityMPerS = v;
  massKg = m;
  inverseMassPerKg = invM;
  nodeVolumeM3 = volume;
  forceN = f;
}

export function setSpringLayout(count: i32, table: usize): void {
  springCount = count;
  springTable = table;
}

export function setHingeLayout(count: i32, table: usize): void {
  hingeCount = count;
  hingeTable = table;
}

export function setClampLayout(count: i32, table: usize): void {
  clampCount = count;
  clampTable = table;
}

export function setPanelLayout(count: i32, nodesPerPanel: i32, nodes: usize, widthM: f64): void {
  panelCount = count;
  panelNodeCount = nodesPerPanel;
  panelNodes = nodes;
  panelWidthM = widthM;
}

export function setHandleLayout(count: i32, nodes: usize, forces: usize): void {
  handleCount = count;
  handleNodes = nodes;
  handleForceN = forces;
}

export function setDrivenLayout(count: i32, nodes: usize, start: usize, target: usize, velocity: usize): void {
  drivenCount = count;
  drivenNodes = nodes;
  drivenStartM = start;
  drivenTargetM = target;
  drivenVelocityMPerS = velocity;
}

/** The world as the JavaScript step reads it; buoyantDensity is already 0 when buoyancy is off. */
export function setWorld(
  gx: f64, gy: f64, gz: f64, drag: f64, buoyantDensity: f64,
  ground: bool, heightM: f64, muS: f64, muK: f64,
  fluid: bool, cn: f64, ct: f64, fx: f64, fy: f64, fz: f64,
): void {
  gravityX = gx;
  gravityY = gy;
  gravityZ = gz;
  airDragPerS = drag;
  buoyantDensityKgPerM3 = buoyantDensity;
  groundEnabled = ground;
  groundHeightM = heightM;
  staticFriction = muS;
  kineticFriction = muK;
  fluidEnabled = fluid;
  normalDragNsPerM3 = cn;
  tangentialDragNsPerM3 = ct;
  flowX = fx;
  flowY = fy;
  flowZ = fz;
}

/** Byte offset of node i's xyz triple. */
// @ts-ignore: decorator
@inline function xyz(i: u32): usize {
  return <usize>i * 24;
}

export function writeBodyForces(): void {
  const m = massKg;
  const invM = inverseMassPerKg;
  const v = velocityMPerS;
  const volume = nodeVolumeM3;
  const f = forceN;
  const gxy = f64x2(gravityX, gravityY);
  const gz = gravityZ;
  const drag = airDragPerS;
  const buoyantDensity = buoyantDensityKgPerM3;
  const n = nodeCount;
  for (let i: i32 = 0; i < n; i++) {
    const o = xyz(<u32>i);
    const fo = f + o;
    const mi = load<f64>(m + (<usize>i << 3));
    if (load<f64>(invM + (<usize>i << 3)) == 0) {
      v128.store(fo, f64x2.splat(0));
      store<f64>(fo, 0, 16);
      continue;
    }
    const weightMass = mi - buoyantDensity * load<f64>(volume + (<usize>i << 3));
    const dragMass = mi * drag;
    const vo = v + o;
    v128.store(fo, f64x2.sub(f64x2.mul(f64x2.splat(weightMass), gxy), f64x2.mul(f64x2.splat(dragMass), v128.load(vo))));
    store<f64>(fo, weightMass * gz - dragMass * load<f64>(vo, 16), 16);
  }
}

export function accumulateSpringForces(): void {
  const x = positionM;
  const v = velocityMPerS;
  const f = forceN;
  const count = springCount;
  const pairsEnd = springTable + (<usize>(count & ~1) << 5);
  let sp = springTable;
  // Two springs at a time, one per f64x2 lane: each lane performs exactly the scalar operations
  // of its spring, and the forces are then added in spring order, so every node's sum is taken
  // in the order of the JavaScript loop. A pair with a zero-length spring goes the scalar way.
  for (; sp < pairsEnd; sp += 64) {
    const xa0 = x + <usize>load<u32>(sp);
    const xb0 = x + <usize>load<u32>(sp, 4);
    const xa1 = x + <usize>load<u32>(sp, 32);
    const xb1 = x + <usize>load<u32>(sp, 36);
    const dx = f64x2.sub(lanes(xb0, xb1, 0), lanes(xa0, xa1, 0));
    const dy = f64x2.sub(lanes(xb0, xb1, 8), lanes(xa0, xa1, 8));
    const dz = f64x2.sub(lanes(xb0, xb1, 16), lanes(xa0, xa1, 16));
    const length = f64x2.sqrt(f64x2.add(f64x2.add(f64x2.mul(dx, dx), f64x2.mul(dy, dy)), f64x2.mul(dz, dz)));
    if (f64x2.extract_lane(length, 0) == 0 || f64x2.extract_lane(length, 1) == 0) {
      accumulateOneSpring(sp, x, v, f);
      accumulateOneSpring(sp + 32, x, v, f);
      continue;
    }
    const inv = f64x2.div(f64x2.splat(1), length);
    const nx = f64x2.mul(dx, inv);
    const ny = f64x2.mul(dy, inv);
    const nz = f64x2.mul(dz, inv);
    const va0 = v + (xa0 - x);
    const vb0 = v + (xb0 - x);
    const va1 = v + (xa1 - x);
    const vb1 = v + (xb1 - x);
    const dvn = f64x2.add(f64x2.add(
      f64x2.mul(f64x2.sub(lanes(vb0, vb1, 0), lanes(va0, va1, 0)), nx),
      f64x2.mul(f64x2.sub(lanes(vb0, vb1, 8), lanes(va0, va1, 8)), ny)),
      f64x2.mul(f64x2.sub(lanes(vb0, vb1, 16), lanes(va0, va1, 16)), nz));
    const rest = lanes(sp, sp + 32, 8);
    const k = lanes(sp, sp + 32, 16);
    const c = lanes(sp, sp + 32, 24);
    const force = f64x2.add(f64x2.mul(k, f64x2.sub(length, rest)), f64x2.mul(c, dvn));
    const fx = f64x2.mul(force, nx);
    const fy = f64x2.mul(force, ny);
    const fz = f64x2.mul(force, nz);
    const fxy0 = v128.shuffle<f64>(fx, fy, 0, 2);
    const fxy1 = v128.shuffle<f64>(fx, fy, 1, 3);
    const fa0 = f + (xa0 - x);
    const fb0 = f + (xb0 - x);
    v128.store(fa0, f64x2.add(v128.load(fa0), fxy0));
    store<f64>(fa0, load<f64>(fa0, 16) + f64x2.extract_lane(fz, 0), 16);
    v128.store(fb0, f64x2.sub(v128.load(fb0), fxy0));
    store<f64>(fb0, load<f64>(fb0, 16) - f64x2.extract_lane(fz, 0), 16);
    const fa1 = f + (xa1 - x);
    const fb1 = f + (xb1 - x);
    v128.store(fa1, f64x2.add(v128.load(fa1), fxy1));
    store<f64>(fa1, load<f64>(fa1, 16) + f64x2.extract_lane(fz, 1), 16);
    v128.store(fb1, f64x2.sub(v128.load(fb1), fxy1));
    store<f64>(fb1, load<f64>(fb1, 16) - f64x2.extract_lane(fz, 1), 16);
  }
  if (count & 1) accumulateOneSpring(sp, x, v, f);
}

/** The doubles at p0 + offset and p1 + offset as the two lanes of one f64x2. */
// @ts-ignore: decorator
@inline function lanes(p0: usize, p1: usize, offset: usize): v128 {
  return f64x2.replace_lane(f64x2.splat(load<f64>(p0 + offset)), 1, load<f64>(p1 + offset));
}

/** One spring of accumulateSpringForces, the x and y lanes in one f64x2 and z alone. */
// @ts-ignore: decorator
@inline function accumulateOneSpring(sp: usize, x: usize, v: usize, f: usize): void {
  const ia = <usize>load<u32>(sp);
  const ib = <usize>load<u32>(sp, 4);
  const xa = x + ia;
  const xb = x + ib;
  const dxy = f64x2.sub(v128.load(xb), v128.load(xa));
  const dz = load<f64>(xb, 16) - load<f64>(xa, 16);
  const dxy2 = f64x2.mul(dxy, dxy);
  const length = sqrt<f64>(f64x2.extract_lane(dxy2, 0) + f64x2.extract_lane(dxy2, 1) + dz * dz);
  if (length == 0) return;
  const inv = 1 / length;
  const nxy = f64x2.mul(dxy, f64x2.splat(inv));
  const nz = dz * inv;
  const va = v + ia;
  const vb = v + ib;
  const dvxy = f64x2.mul(f64x2.sub(v128.load(vb), v128.load(va)), nxy);
  const dvn = f64x2.extract_lane(dvxy, 0) + f64x2.extract_lane(dvxy, 1) + (load<f64>(vb, 16) - load<f64>(va, 16)) * nz;
  const force = load<f64>(sp, 16) * (length - load<f64>(sp, 8)) + load<f64>(sp, 24) * dvn;
  const fxy = f64x2.mul(f64x2.splat(force), nxy);
  const fz = force * nz;
  const fa = f + ia;
  const fb = f + ib;
  v128.store(fa, f64x2.add(v128.load(fa), fxy));
  store<f64>(fa, load<f64>(fa, 16) + fz, 16);
  v128.store(fb, f64x2.sub(v128.load(fb), fxy));
  store<f64>(fb, load<f64>(fb, 16) - fz, 16);
}

/** sim/core/bending-forces.ts STRAIGHT_HINGE_W2: below it w is rounding noise. */
const STRAIGHT_HINGE_W2: f64 = 1e-28;

// The hinge and clamp passes stay scalar: each term is the JavaScript expression with its
// parentheses, so every sum is taken in the same order.
export function accumulateBendingForces(): void {
  const x = positionM;
  const v = velocityMPerS;
  const f = forceN;
  const count = hingeCount;
  for (let h: i32 = 0; h < count; h++) {
    const hp = hingeTable + (<usize>h << 5);
    const ip = <usize>load<u32>(hp);
    const im = <usize>load<u32>(hp, 4);
    const iN = <usize>load<u32>(hp, 8);
    const xp = x + ip;
    const xm = x + im;
    const xn = x + iN;
    const eax = load<f64>(xm) - load<f64>(xp);
    const eay = load<f64>(xm, 8) - load<f64>(xp, 8);
    const eaz = load<f64>(xm, 16) - load<f64>(xp, 16);
    const ebx = load<f64>(xn) - load<f64>(xm);
    const eby = load<f64>(xn, 8) - load<f64>(xm, 8);
    const ebz = load<f64>(xn, 16) - load<f64>(xm, 16);
    const la = sqrt<f64>(eax * eax + eay * eay + eaz * eaz);
    const lb = sqrt<f64>(ebx * ebx + eby * eby + ebz * ebz);
    if (la == 0 || lb == 0) continue;
    const ila = 1 / la;
    const ilb = 1 / lb;
    const tax = eax * ila;
    const tay = eay * ila;
    const taz = eaz * ila;
    const tbx = ebx * ilb;
    const tby = eby * ilb;
    const tbz = ebz * ilb;
    const cosPhi = tax * tbx + tay * tby + taz * tbz;
    const uax = (tbx - cosPhi * tax) * ila;
    const uay = (tby - cosPhi * tay) * ila;
    const uaz = (tbz - cosPhi * taz) * ila;
    const ubx = (tax - cosPhi * tbx) * ilb;
    const uby = (tay - cosPhi * tby) * ilb;
    const ubz = (taz - cosPhi * tbz) * ilb;
    let s = load<f64>(hp, 16);
    const damping = load<f64>(hp, 24);
    if (damping > 0) {
      const wx = tbx - tax;
      const wy = tby - tay;
      const wz = tbz - taz;
      const w2 = wx * wx + wy * wy + wz * wz;
      if (w2 > STRAIGHT_HINGE_W2) {
        const vp = v + ip;
        const vm = v + im;
        const vn = v + iN;
        const wDot =
          -(uax * (load<f64>(vm) - load<f64>(vp)) + uay * (load<f64>(vm, 8) - load<f64>(vp, 8)) + uaz * (load<f64>(vm, 16) - load<f64>(vp, 16)) +
            (ubx * (load<f64>(vn) - load<f64>(vm)) + uby * (load<f64>(vn, 8) - load<f64>(vm, 8)) + ubz * (load<f64>(vn, 16) - load<f64>(vm, 16))));
        s += (damping * wDot) / w2;
      }
    }
    const fp = f + ip;
    const fm = f + im;
    const fn = f + iN;
    store<f64>(fp, load<f64>(fp) - s * uax);
    store<f64>(fp, load<f64>(fp, 8) - s * uay, 8);
    store<f64>(fp, load<f64>(fp, 16) - s * uaz, 16);
    store<f64>(fm, load<f64>(fm) + s * (uax - ubx));
    store<f64>(fm, load<f64>(fm, 8) + s * (uay - uby), 8);
    store<f64>(fm, load<f64>(fm, 16) + s * (uaz - ubz), 16);
    store<f64>(fn, load<f64>(fn) + s * ubx);
    store<f64>(fn, load<f64>(fn, 8) + s * uby, 8);
    store<f64>(fn, load<f64>(fn, 16) + s * ubz, 16);
  }
}

export function accumulateClampForces(): void {
  const x = positionM;
  const v = velocityMPerS;
  const f = forceN;
  const count = clampCount;
  for (let q: i32 = 0; q < count; q++) {
    const cp = clampTable + <usize>q * 48;
    const ia = <usize>load<u32>(cp);
    const ib = <usize>load<u32>(cp, 4);
    const xa = x + ia;
    const xb = x + ib;
    const ex = load<f64>(xb) - load<f64>(xa);
    const ey = load<f64>(xb, 8) - load<f64>(xa, 8);
    const ez = load<f64>(xb, 16) - load<f64>(xa, 16);
    const length = sqrt<f64>(ex * ex + ey * ey + ez * ez);
    if (length == 0) continue;
    const il = 1 / length;
    const tx = ex * il;
    const ty = ey * il;
    const tz = ez * il;
    const dx = load<f64>(cp, 8);
    const dy = load<f64>(cp, 16);
    const dz = load<f64>(cp, 24);
    const cosPhi = tx * dx + ty * dy + tz * dz;
    const ux = (dx - cosPhi * tx) * il;
    const uy = (dy - cosPhi * ty) * il;
    const uz = (dz - cosPhi * tz) * il;
    let s = load<f64>(cp, 32);
    const damping = load<f64>(cp, 40);
    if (damping > 0) {
      const wx = tx - dx;
      const wy = ty - dy;
      const wz = tz - dz;
      const w2 = wx * wx + wy * wy + wz * wz;
      if (w2 > STRAIGHT_HINGE_W2) {
        const va = v + ia;
        const vb = v + ib;
        const wDot = -(ux * (load<f64>(vb) - load<f64>(va)) + uy * (load<f64>(vb, 8) - load<f64>(va, 8)) + uz * (load<f64>(vb, 16) - load<f64>(va, 16)));
        s += (damping * wDot) / w2;
      }
    }
    const fa = f + ia;
    const fb = f + ib;
    store<f64>(fa, load<f64>(fa) - s * ux);
    store<f64>(fa, load<f64>(fa, 8) - s * uy, 8);
    store<f64>(fa, load<f64>(fa, 16) - s * uz, 16);
    store<f64>(fb, load<f64>(fb) + s * ux);
    store<f64>(fb, load<f64>(fb, 8) + s * uy, 8);
    store<f64>(fb, load<f64>(fb, 16) + s * uz, 16);
  }
}

export function accumulateFluidDrag(): void {
  if (panelNodeCount == 2) accumulateSegmentDrag();
  else accumulateQuadDrag();
}

export function accumulateSegmentDrag(): void {
  const x = positionM;
  const v = velocityMPerS;
  const p = panelNodes;
  const f = forceN;
  const cn = normalDragNsPerM3;
  const ct = tangentialDragNsPerM3;
  const fx0 = flowX;
  const fy0 = flowY;
  const fz0 = flowZ;
  const width = panelWidthM;
  const count = panelCount;
  for (let q: i32 = 0; q < count; q++) {
    const pq = p + (<usize>q << 3);
    const ia = xyz(load<u32>(pq));
    const ib = xyz(load<u32>(pq, 4));
    const xa = x + ia;
    const xb = x + ib;
    const dx = load<f64>(xb) - load<f64>(xa);
    const dy = load<f64>(xb, 8) - load<f64>(xa, 8);
    const dz = load<f64>(xb, 16) - load<f64>(xa, 16);
    const length = sqrt<f64>(dx * dx + dy * dy + dz * dz);
    if (length == 0) continue;
    const tx = dx / length;
    const ty = dy / length;
    const tz = dz / length;
    const va = v + ia;
    const vb = v + ib;
    const ux = 0.5 * (load<f64>(va) + load<f64>(vb)) - fx0;
    const uy = 0.5 * (load<f64>(va, 8) + load<f64>(vb, 8)) - fy0;
    const uz = 0.5 * (load<f64>(va, 16) + load<f64>(vb, 16)) - fz0;
    const ut = ux * tx + uy * ty + uz * tz;
    const area = length * width;
    const half = 0.5 * area;
    const fx = -half * (ct * ut * tx + cn * (ux - ut * tx));
    const fy = -half * (ct * ut * ty + cn * (uy - ut * ty));
    const fz = -half * (ct * ut * tz + cn * (uz - ut * tz));
    const fa = f + ia;
    const fb = f + ib;
    store<f64>(fa, load<f64>(fa) + fx);
    store<f64>(fa, load<f64>(fa, 8) + fy, 8);
    store<f64>(fa, load<f64>(fa, 16) + fz, 16);
    store<f64>(fb, load<f64>(fb) + fx);
    store<f64>(fb, load<f64>(fb, 8) + fy, 8);
    store<f64>(fb, load<f64>(fb, 16) + fz, 16);
  }
}

export function accumulateQuadDrag(): void {
  const x = positionM;
  const v = velocityMPerS;
  const p = panelNodes;
  const f = forceN;
  const cn = normalDragNsPerM3;
  const ct = tangentialDragNsPerM3;
  const fx0 = flowX;
  const fy0 = flowY;
  const fz0 = flowZ;
  const count = panelCount;
  for (let q: i32 = 0; q < count; q++) {
    const pq = p + (<usize>q << 4);
    const i0 = xyz(load<u32>(pq));
    const i1 = xyz(load<u32>(pq, 4));
    const i2 = xyz(load<u32>(pq, 8));
    const i3 = xyz(load<u32>(pq, 12));
    const x0 = x + i0;
    const x1 = x + i1;
    const x2 = x + i2;
    const x3 = x + i3;
    const ax = load<f64>(x2) - load<f64>(x0);
    const ay = load<f64>(x2, 8) - load<f64>(x0, 8);
    const az = load<f64>(x2, 16) - load<f64>(x0, 16);
    const bx = load<f64>(x3) - load<f64>(x1);
    const by = load<f64>(x3, 8) - load<f64>(x1, 8);
    const bz = load<f64>(x3, 16) - load<f64>(x1, 16);
    const cx = ay * bz - az * by;
    const cy = az * bx - ax * bz;
    const cz = ax * by - ay * bx;
    const cross = sqrt<f64>(cx * cx + cy * cy + cz * cz);
    if (cross == 0) continue;
    const area = 0.5 * cross;
    const nx = cx / cross;
    const ny = cy / cross;
    const nz = cz / cross;
    const v0 = v + i0;
    const v1 = v + i1;
    const v2 = v + i2;
    const v3 = v + i3;
    const ux = 0.25 * (load<f64>(v0) + load<f64>(v1) + load<f64>(v2) + load<f64>(v3)) - fx0;
    const uy = 0.25 * (load<f64>(v0, 8) + load<f64>(v1, 8) + load<f64>(v2, 8) + load<f64>(v3, 8)) - fy0;
    const uz = 0.25 * (load<f64>(v0, 16) + load<f64>(v1, 16) + load<f64>(v2, 16) + load<f64>(v3, 16)) - fz0;
    const un = ux * nx + uy * ny + uz * nz;
    const quarter = 0.25 * area;
    const fx = -quarter * (cn * un * nx + ct * (ux - un * nx));
    const fy = -quarter * (cn * un * ny + ct * (uy - un * ny));
    const fz = -quarter * (cn * un * nz + ct * (uz - un * nz));
    const f0 = f + i0;
    store<f64>(f0, load<f64>(f0) + fx);
    store<f64>(f0, load<f64>(f0, 8) + fy, 8);
    store<f64>(f0, load<f64>(f0, 16) + fz, 16);
    const f1 = f + i1;
    store<f64>(f1, load<f64>(f1) + fx);
    store<f64>(f1, load<f64>(f1, 8) + fy, 8);
    store<f64>(f1, load<f64>(f1, 16) + fz, 16);
    const f2 = f + i2;
    store<f64>(f2, load<f64>(f2) + fx);
    store<f64>(f2, load<f64>(f2, 8) + fy, 8);
    store<f64>(f2, load<f64>(f2, 16) + fz, 16);
    const f3 = f + i3;
    store<f64>(f3, load<f64>(f3) + fx);
    store<f64>(f3, load<f64>(f3, 8) + fy, 8);
    store<f64>(f3, load<f64>(f3, 16) + fz, 16);
  }
}

export function projectGroundContact(dtS: f64): void {
  const x = positionM;
  const v = velocityMPerS;
  const invM = inverseMassPerKg;
  const h = groundHeightM;
  const muS = staticFriction;
  const muK = kineticFriction;
  const n = nodeCount;
  for (let i: i32 = 0; i < n; i++) {
    if (load<f64>(invM + (<usize>i << 3)) == 0) continue;
    const o = xyz(<u32>i);
    const xo = x + o;
    const vo = v + o;
    const y = load<f64>(xo, 8);
    const vy = load<f64>(vo, 8);
    if (y + dtS * vy >= h) continue;
    const landing = y < h ? 0 : (h - y) / dtS;
    const dvn = landing - vy;
    store<f64>(vo, landing, 8);
    const vx = load<f64>(vo);
    const vz = load<f64>(vo, 16);
    const speed = sqrt<f64>(vx * vx + vz * vz);
    if (speed <= muS * dvn) {
      store<f64>(vo, 0);
      store<f64>(vo, 0, 16);
    } else {
      // f64.max, like Math.max, returns +0 for (0, −0); the two differ only in NaN payloads,
      // and a NaN state is rejected by the blow-up check either way.
      const scale = max<f64>(0, 1 - (muK * dvn) / speed);
      store<f64>(vo, vx * scale);
      store<f64>(vo, vz * scale, 16);
    }
    if (y < h) store<f64>(xo, h, 8);
  }
}

export function updateVelocities(dtS: f64): void {
  const v = velocityMPerS;
  const invM = inverseMassPerKg;
  const f = forceN;
  const n = nodeCount;
  for (let i: i32 = 0; i < n; i++) {
    const w = load<f64>(invM + (<usize>i << 3)) * dtS;
    const o = xyz(<u32>i);
    const vo = v + o;
    const fo = f + o;
    v128.store(vo, f64x2.add(v128.load(vo), f64x2.mul(f64x2.splat(w), v128.load(fo))));
    store<f64>(vo, load<f64>(vo, 16) + w * load<f64>(fo, 16), 16);
  }
}

export function updatePositions(dtS: f64): void {
  const x = positionM;
  const v = velocityMPerS;
  const invM = inverseMassPerKg;
  const dt2 = f64x2.splat(dtS);
  const n = nodeCount;
  for (let i: i32 = 0; i < n; i++) {
    if (load<f64>(invM + (<usize>i << 3)) == 0) continue;
    const o = xyz(<u32>i);
    const xo = x + o;
    const vo = v + o;
    v128.store(xo, f64x2.add(v128.load(xo), f64x2.mul(dt2, v128.load(vo))));
    store<f64>(xo, load<f64>(xo, 16) + dtS * load<f64>(vo, 16), 16);
  }
}

export function updateVelocitiesAndPositions(dtS: f64): void {
  const x = positionM;
  const v = velocityMPerS;
  const invM = inverseMassPerKg;
  const f = forceN;
  const dt2 = f64x2.splat(dtS);
  const n = nodeCount;
  for (let i: i32 = 0; i < n; i++) {
    const im = load<f64>(invM + (<usize>i << 3));
    const w = im * dtS;
    const o = xyz(<u32>i);
    const vo = v + o;
    const fo = f + o;
    const vxy = f64x2.add(v128.load(vo), f64x2.mul(f64x2.splat(w), v128.load(fo)));
    const vz = load<f64>(vo, 16) + w * load<f64>(fo, 16);
    v128.store(vo, vxy);
    store<f64>(vo, vz, 16);
    if (im == 0) continue;
    const xo = x + o;
    v128.store(xo, f64x2.add(v128.load(xo), f64x2.mul(dt2, vxy)));
    store<f64>(xo, load<f64>(xo, 16) + dtS * vz, 16);
  }
}

export function step(dtS: f64): void {
  writeBodyForces();
  accumulateSpringForces();
  if (hingeCount > 0) accumulateBendingForces();
  if (clampCount > 0) accumulateClampForces();
  if (fluidEnabled && panelCount > 0) accumulateFluidDrag();
  const f = forceN;
  const nodes = handleNodes;
  const hf = handleForceN;
  const handles = handleCount;
  for (let h: i32 = 0; h < handles; h++) {
    const fo = f + xyz(load<u32>(nodes + (<usize>h << 2)));
    const ho = hf + <usize>h * 24;
    store<f64>(fo, load<f64>(fo) + load<f64>(ho));
    store<f64>(fo, load<f64>(fo, 8) + load<f64>(ho, 8), 8);
    store<f64>(fo, load<f64>(fo, 16) + load<f64>(ho, 16), 16);
  }
  if (groundEnabled) {
    updateVelocities(dtS);
    projectGroundContact(dtS);
    updatePositions(dtS);
  } else {
    updateVelocitiesAndPositions(dtS);
  }
}

/** Fixed-length steps with no control changes in between (the reference bench cases). */
export function advanceSteps(dtS: f64, count: i32): void {
  for (let s: i32 = 0; s < count; s++) step(dtS);
}

export function advanceInterval(intervalS: f64, substeps: i32): void {
  const dtS = intervalS / <f64>substeps;
  const x = positionM;
  const driven = drivenCount;
  if (driven > 0) {
    for (let d: i32 = 0; d < driven; d++) {
      const o = xyz(load<u32>(drivenNodes + (<usize>d << 2)));
      const od = <usize>d * 24;
      for (let k: usize = 0; k < 24; k += 8) {
        const xk = load<f64>(x + o + k);
        store<f64>(drivenStartM + od + k, xk);
        store<f64>(drivenVelocityMPerS + od + k, (load<f64>(drivenTargetM + od + k) - xk) / intervalS);
      }
    }
  }
  for (let s: i32 = 0; s < substeps; s++) {
    step(dtS);
    if (driven > 0) placeDrivenNodes(<f64>(s + 1) / <f64>substeps);
  }
}

export function placeDrivenNodes(fraction: f64): void {
  const x = positionM;
  const v = velocityMPerS;
  const driven = drivenCount;
  for (let d: i32 = 0; d < driven; d++) {
    const o = xyz(load<u32>(drivenNodes + (<usize>d << 2)));
    const od = <usize>d * 24;
    for (let k: usize = 0; k < 24; k += 8) {
      const start = load<f64>(drivenStartM + od + k);
      store<f64>(x + o + k, start + fraction * (load<f64>(drivenTargetM + od + k) - start));
      store<f64>(v + o + k, load<f64>(drivenVelocityMPerS + od + k));
    }
  }
}
