// Runs a Simulator's steps in the WebAssembly kernel. At construction it lays out every array
// the step reads in one linear memory, sized once and never grown (growth would detach the
// views below), and copies the model's fixed data in. The model's own typed arrays stay the
// state the rest of Pliant reads and writes: positions and velocities are copied in at the start
// of each call and out at its end, so one copy pair per control interval serves all its
// sub-steps, and callers may set a model's state between calls as with the JavaScript kernel.
// Rest lengths are copied in after each actuation (syncRestLengths); handle forces and driven
// targets are written by the JavaScript control code straight into views of this memory.
// Topology, masses, volumes, stiffness and damping (springs, hinges, clamps, clamp directions)
// are read once, here.
import type { Model } from '../model.ts';
import type { World } from '../world.ts';
import type { StepKernelExports } from './step-kernel-module.ts';
import { instantiateStepKernel, WASM_PAGE_BYTES } from './step-kernel-module.ts';

/** Bump allocator over byte offsets, 8-byte aligned. */
class MemoryPlan {
  bytes = 0;
  take(byteLength: number): number {
    const at = this.bytes;
    this.bytes += Math.ceil(byteLength / 8) * 8;
    return at;
  }
}

export class WasmStepper {
  /** Views onto the kernel's memory. */
  readonly forceN: Float64Array;
  readonly handleForceN: Float64Array;
  readonly drivenTargetM: Float64Array;
  private readonly positionM: Float64Array;
  private readonly velocityMPerS: Float64Array;
  /** The spring table as doubles: rest length at 4s + 1, stiffness 4s + 2, damping 4s + 3. */
  private readonly springTable: Float64Array;
  private readonly kernel: StepKernelExports;

  constructor(private readonly model: Model) {
    const n3 = 3 * model.nodeCount;
    const n = model.nodeCount;
    const s = model.springCount;
    const handles = model.handleNodes.length;
    const driven = model.drivenNodes.length;
    const plan = new MemoryPlan();
    const at = {
      x: plan.take(8 * n3), v: plan.take(8 * n3), m: plan.take(8 * n), invM: plan.take(8 * n), volume: plan.take(8 * n), f: plan.take(8 * n3),
      springs: plan.take(32 * s),
      hinges: plan.take(32 * model.hingeCount),
      clamps: plan.take(48 * model.clampCount),
      panels: plan.take(4 * model.panelNodes.length),
      handles: plan.take(4 * handles), handleForce: plan.take(8 * 3 * handles),
      driven: plan.take(4 * driven), drivenStart: plan.take(8 * 3 * driven), drivenTarget: plan.take(8 * 3 * driven), drivenVelocity: plan.take(8 * 3 * driven),
    };
    const pages = Math.max(1, Math.ceil(plan.bytes / WASM_PAGE_BYTES));
    const { kernel, memory } = instantiateStepKernel(pages);
    this.kernel = kernel;
    const buffer = memory.buffer;
    const f64 = (offset: number, length: number) => new Float64Array(buffer, offset, length);
    const u32 = (offset: number, length: number) => new Uint32Array(buffer, offset, length);
    this.positionM = f64(at.x, n3);
    this.velocityMPerS = f64(at.v, n3);
    this.forceN = f64(at.f, n3);
    this.springTable = f64(at.springs, 4 * s);
    this.handleForceN = f64(at.handleForce, 3 * handles);
    this.drivenTargetM = f64(at.drivenTarget, 3 * driven);
    f64(at.m, n).set(model.massKg);
    f64(at.invM, n).set(model.inverseMassPerKg);
    f64(at.volume, n).set(model.nodeVolumeM3);
    // Spring records (layout in the kernel source): ends as byte offsets of the nodes' triples.
    const ends = u32(at.springs, 8 * s);
    for (let i = 0; i < s; i++) {
      ends[8 * i] = 24 * model.springNodeA[i];
      ends[8 * i + 1] = 24 * model.springNodeB[i];
      this.springTable[4 * i + 2] = model.stiffnessNPerM[i];
      this.springTable[4 * i + 3] = model.dampingNsPerM[i];
    }
    this.syncRestLengths();
    // Hinge and clamp records (layout in the kernel source), ends as byte offsets like springs'.
    const hingeWords = u32(at.hinges, 8 * model.hingeCount);
    const hingeTable = f64(at.hinges, 4 * model.hingeCount);
    for (let h = 0; h < model.hingeCount; h++) {
      for (let k = 0; k < 3; k++) hingeWords[8 * h + k] = 24 * model.hingeNodes[3 * h + k];
      hingeTable[4 * h + 2] = model.hingeStiffnessNm[h];
      hingeTable[4 * h + 3] = model.hingeDampingNms[h];
    }
    const clampWords = u32(at.clamps, 12 * model.clampCount);
    const clampTable = f64(at.clamps, 6 * model.clampCount);
    for (let q = 0; q < model.clampCount; q++) {
      clampWords[12 * q] = 24 * model.clampNodes[2 * q];
      clampWords[12 * q + 1] = 24 * model.clampNodes[2 * q + 1];
      for (let k = 0; k < 3; k++) clampTable[6 * q + 1 + k] = model.clampDirectionUnit[3 * q + k];
      clampTable[6 * q + 4] = model.clampStiffnessNm[q];
      clampTable[6 * q + 5] = model.clampDampingNms[q];
    }
    u32(at.panels, model.panelNodes.length).set(model.panelNodes);
    u32(at.handles, handles).set(model.handleNodes);
    u32(at.driven, driven).set(model.drivenNodes);
    this.drivenTargetM.set(model.drivenOriginM);
    kernel.setNodeLayout(n, at.x, at.v, at.m, at.invM, at.volume, at.f);
    kernel.setSpringLayout(s, at.springs);
    kernel.setHingeLayout(model.hingeCount, at.hinges);
    kernel.setClampLayout(model.clampCount, at.clamps);
    kernel.setPanelLayout(model.panelCount, model.panelNodeCount, at.panels, model.panelWidthM);
    kernel.setHandleLayout(handles, at.handles, at.handleForce);
    kernel.setDrivenLayout(driven, at.driven, at.drivenStart, at.drivenTarget, at.drivenVelocity);
  }

  /** After the actuation has rewritten the model's rest lengths. */
  syncRestLengths(): void {
    const rest = this.model.restLengthM;
    const table = this.springTable;
    for (let i = 0; i < rest.length; i++) table[4 * i + 1] = rest[i];
  }

  step(dtS: number, world: World): void {
    this.enter(world);
    this.kernel.step(dtS);
    this.leave();
  }

  advanceSteps(dtS: number, count: number, world: World): void {
    this.enter(world);
    this.kernel.advanceSteps(dtS, count);
    this.leave();
  }

  advanceInterval(intervalS: number, substeps: number, world: World): void {
    this.enter(world);
    this.kernel.advanceInterval(intervalS, substeps);
    this.leave();
  }

  /** The world is passed on every call because the JavaScript step reads it on every step. */
  private enter(world: World): void {
    const fluid = world.fluid;
    const ground = world.ground;
    const g = world.gravityMPerS2;
    const buoyantDensity = fluid.enabled && fluid.buoyancy ? fluid.densityKgPerM3 : 0;
    this.kernel.setWorld(
      g[0], g[1], g[2], world.airDragPerS, buoyantDensity,
      ground.enabled ? 1 : 0, ground.heightM, ground.staticFriction, ground.kineticFriction,
      fluid.enabled ? 1 : 0, fluid.normalDragNsPerM3, fluid.tangentialDragNsPerM3,
      fluid.flowVelocityMPerS[0], fluid.flowVelocityMPerS[1], fluid.flowVelocityMPerS[2],
    );
    this.positionM.set(this.model.positionM);
    this.velocityMPerS.set(this.model.velocityMPerS);
  }

  private leave(): void {
    this.model.positionM.set(this.positionM);
    this.model.velocityMPerS.set(this.velocityMPerS);
  }
}
