// Semi-implicit (symplectic) Euler time stepping of a Model in a World:
//   v_{n+1} = v_n + dt · M⁻¹ f(x_n, v_n),   x_{n+1} = x_n + dt · v_{n+1}.
// The caller sets a control vector once per control interval (zero-order hold for forces and
// actuators; driven nodes move linearly to their new target over the interval) and then
// advances a number of equal sub-steps. All buffers are allocated in the constructor.
// An optional StepLedger (energy accounting, force recording) is consulted through one null
// check per hook; without it the step runs exactly the operations it always did.
// The step runs in JavaScript (below, the specification) or in its WebAssembly build
// (wasm/wasm-stepper.ts), chosen once per Simulator; both give the same bits. WebAssembly runs
// only where it implements every pass this model and world need (wasm/wasm-kernel-coverage.ts):
// a pass added here must be registered there, or the kernel stands aside for everything.
import { accumulateBendingForces, accumulateClampForces } from './bending-forces.ts';
import { writeBodyForces } from './body-forces.ts';
import { applyActuation, writeDrivenTargets, writeHandleForces } from './control-application.ts';
import { accumulateFluidDrag } from './fluid-drag.ts';
import { projectGroundContact } from './ground-contact.ts';
import type { Model } from './model.ts';
import { projectObstacleContact } from './obstacle-contact.ts';
import { accumulateSpringForces } from './spring-forces.ts';
import type { StepKernel } from './step-kernel-choice.ts';
import { resolveStepKernel } from './step-kernel-choice.ts';
import { StepLedger } from './step-ledger.ts';
import { wasmKernelCoverage } from './wasm/wasm-kernel-coverage.ts';
import { WasmStepper } from './wasm/wasm-stepper.ts';
import type { World } from './world.ts';

export interface SimulatorOptions {
  /**
   * Default: 'wasm' where WebAssembly can run, else 'js'. 'wasm' is a preference: where the
   * WebAssembly kernel lacks a pass this model or world needs, the JavaScript kernel runs
   * (see kernelFallbackReason). Never changes a result.
   */
  kernel?: StepKernel;
  /**
   * Energy accounting from the start state, and force recording when `recordForces`. Books work
   * inside the step, which only the JavaScript kernel does, so it runs JavaScript.
   */
  ledger?: { recordForces: boolean };
}

export class Simulator {
  readonly forceN: Float64Array;
  private readonly handleForceN: Float64Array;
  private readonly drivenStartM: Float64Array;
  private readonly drivenTargetM: Float64Array;
  private readonly drivenVelocityMPerS: Float64Array;
  private readonly obstacleNormal = new Float64Array(3);
  /** Energy accounting and force recording (the `ledger` option); null costs nothing. */
  readonly ledger: StepLedger | null;
  /** The kernel this simulator steps with. */
  readonly kernel: StepKernel;
  /** Why WebAssembly was preferred but JavaScript runs; null otherwise. */
  readonly kernelFallbackReason: string | null;
  private readonly wasm: WasmStepper | null;
  timeS = 0;

  constructor(readonly model: Model, readonly world: World, options: SimulatorOptions = {}) {
    const preferred = resolveStepKernel(options.kernel);
    const coverage = preferred === 'wasm' ? wasmKernelCoverage(model, world, options as Readonly<Record<string, unknown>>) : null;
    this.kernel = coverage === null || coverage.ok ? preferred : 'js';
    this.kernelFallbackReason = coverage !== null && !coverage.ok ? coverage.reason : null;
    this.wasm = this.kernel === 'wasm' ? new WasmStepper(model) : null;
    // With WebAssembly the control code writes handle forces and driven targets into its memory.
    this.forceN = this.wasm?.forceN ?? new Float64Array(3 * model.nodeCount);
    this.handleForceN = this.wasm?.handleForceN ?? new Float64Array(3 * model.handleNodes.length);
    this.drivenStartM = new Float64Array(3 * model.drivenNodes.length);
    this.drivenTargetM = this.wasm?.drivenTargetM ?? Float64Array.from(model.drivenOriginM);
    this.drivenVelocityMPerS = new Float64Array(3 * model.drivenNodes.length);
    this.ledger = options.ledger !== undefined ? new StepLedger(model, world, this.handleForceN, options.ledger.recordForces) : null;
  }

  /** Applies a control vector (length ≥ model.controlChannelCount) until the next call. */
  setControls(controls: Float64Array): void {
    const model = this.model;
    if (model.actuationEntryCount > 0) {
      applyActuation(model, controls);
      this.wasm?.syncRestLengths();
    }
    writeHandleForces(model, controls, this.handleForceN);
    if (model.drivenNodes.length > 0) writeDrivenTargets(model, controls, this.drivenTargetM);
  }

  /** Advances one control interval of `substeps` equal steps, intervalS long in total. */
  advanceInterval(intervalS: number, substeps: number): void {
    const dtS = intervalS / substeps;
    if (this.wasm !== null) {
      this.wasm.advanceInterval(intervalS, substeps, this.world);
      for (let s = 0; s < substeps; s++) this.timeS += dtS;
      return;
    }
    const model = this.model;
    const driven = model.drivenNodes;
    const x = model.positionM;
    if (driven.length > 0) {
      // Driven nodes travel from where they are to their target at constant velocity.
      for (let d = 0; d < driven.length; d++) {
        const o = 3 * driven[d];
        for (let k = 0; k < 3; k++) {
          this.drivenStartM[3 * d + k] = x[o + k];
          this.drivenVelocityMPerS[3 * d + k] = (this.drivenTargetM[3 * d + k] - x[o + k]) / intervalS;
        }
      }
    }
    for (let s = 0; s < substeps; s++) {
      this.step(dtS);
      if (driven.length > 0) {
        this.placeDrivenNodes((s + 1) / substeps);
        if (this.ledger !== null) this.ledger.afterSupportsMoved(this.forceN);
      }
    }
  }

  /**
   * `count` steps of length dtS with no control change in between. With WebAssembly the state
   * crosses into its memory once for all of them instead of once per step.
   */
  advanceSteps(dtS: number, count: number): void {
    if (this.wasm !== null) {
      this.wasm.advanceSteps(dtS, count, this.world);
      for (let s = 0; s < count; s++) this.timeS += dtS;
      return;
    }
    for (let s = 0; s < count; s++) this.step(dtS);
  }

  /** One semi-implicit Euler step of length dtS. */
  step(dtS: number): void {
    if (this.wasm !== null) {
      this.wasm.step(dtS, this.world);
      this.timeS += dtS;
      return;
    }
    const model = this.model;
    const world = this.world;
    const f = this.forceN;
    writeBodyForces(model, world, f);
    accumulateSpringForces(model, f);
    if (model.hingeCount > 0) accumulateBendingForces(model, f);
    if (model.clampCount > 0) accumulateClampForces(model, f);
    if (world.fluid.enabled && model.panelCount > 0) accumulateFluidDrag(model, world.fluid, f);
    const handles = model.handleNodes;
    const hf = this.handleForceN;
    for (let h = 0; h < handles.length; h++) {
      const o = 3 * handles[h];
      f[o] += hf[3 * h];
      f[o + 1] += hf[3 * h + 1];
      f[o + 2] += hf[3 * h + 2];
    }
    const ledger = this.ledger;
    if (ledger !== null) {
      ledger.beginStep(dtS);
      updateVelocities(model, f, dtS);
      ledger.afterForceUpdate(dtS);
      if (world.ground.enabled) projectGroundContact(model, world.ground, dtS, ledger.contactNormalDvMPerS, ledger.contactFrictionDvMPerS);
      if (world.obstacles.length > 0) {
        projectObstacleContact(model, world.obstacles, dtS, this.obstacleNormal, ledger.contactNormalDvMPerS, ledger.contactFrictionDvMPerS);
      }
      ledger.afterContact();
      updatePositions(model, dtS);
    } else if (world.ground.enabled || world.obstacles.length > 0) {
      updateVelocities(model, f, dtS);
      if (world.ground.enabled) projectGroundContact(model, world.ground, dtS);
      if (world.obstacles.length > 0) projectObstacleContact(model, world.obstacles, dtS, this.obstacleNormal);
      updatePositions(model, dtS);
    } else {
      updateVelocitiesAndPositions(model, f, dtS);
    }
    this.timeS += dtS;
  }

  private placeDrivenNodes(fraction: number): void {
    const driven = this.model.drivenNodes;
    const x = this.model.positionM;
    const v = this.model.velocityMPerS;
    for (let d = 0; d < driven.length; d++) {
      const o = 3 * driven[d];
      for (let k = 0; k < 3; k++) {
        const start = this.drivenStartM[3 * d + k];
        x[o + k] = start + fraction * (this.drivenTargetM[3 * d + k] - start);
        v[o + k] = this.drivenVelocityMPerS[3 * d + k];
      }
    }
  }
}

// The node updates of a step. Each node's update reads only that node, so doing both in one
// pass (when no contact projection has to sit between them) gives the same roundings as two.

function updateVelocities(model: Model, forceN: Float64Array, dtS: number): void {
  const v = model.velocityMPerS;
  const invM = model.inverseMassPerKg;
  const n = model.nodeCount;
  for (let i = 0; i < n; i++) {
    const w = invM[i] * dtS;
    const o = 3 * i;
    v[o] += w * forceN[o];
    v[o + 1] += w * forceN[o + 1];
    v[o + 2] += w * forceN[o + 2];
  }
}

function updatePositions(model: Model, dtS: number): void {
  const x = model.positionM;
  const v = model.velocityMPerS;
  const invM = model.inverseMassPerKg;
  const n = model.nodeCount;
  for (let i = 0; i < n; i++) {
    if (invM[i] === 0) continue;
    const o = 3 * i;
    x[o] += dtS * v[o];
    x[o + 1] += dtS * v[o + 1];
    x[o + 2] += dtS * v[o + 2];
  }
}

function updateVelocitiesAndPositions(model: Model, forceN: Float64Array, dtS: number): void {
  const x = model.positionM;
  const v = model.velocityMPerS;
  const invM = model.inverseMassPerKg;
  const n = model.nodeCount;
  for (let i = 0; i < n; i++) {
    const im = invM[i];
    const w = im * dtS;
    const o = 3 * i;
    const vx = v[o] + w * forceN[o];
    const vy = v[o + 1] + w * forceN[o + 1];
    const vz = v[o + 2] + w * forceN[o + 2];
    v[o] = vx;
    v[o + 1] = vy;
    v[o + 2] = vz;
    if (im === 0) continue;
    x[o] += dtS * vx;
    x[o + 1] += dtS * vy;
    x[o + 2] += dtS * vz;
  }
}
