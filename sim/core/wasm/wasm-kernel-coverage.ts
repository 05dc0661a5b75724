// Whether the WebAssembly kernel implements every pass a given model, world and set of
// Simulator options need. The Simulator asks this once and runs the JavaScript kernel (the
// specification) whenever the answer is no; both kernels give the same bits where both run,
// so the answer only ever changes speed, never a result.
//
// Safe by construction: every field of Model, World (and its ground and fluid) and every
// Simulator option must be claimed by a pass below. A field nobody claims (a new force's data,
// obstacles in the world, an option that books work in the step) means the JavaScript step may
// do something this kernel does not, so the answer is no until someone registers it here.
//
// Adding a JavaScript pass (see DEVELOPERS.md, "Changing the JavaScript step"):
//   1. add a row to STEP_PASSES with the model, world and option fields it reads, `usedBy`
//      saying when the JavaScript step runs it, and `inWasmKernel: false`;
//   2. the WebAssembly kernel then stands aside for exactly the models that use it, and the
//      bit-identity test's rows that use it fail their `kernel === 'wasm'` check;
//   3. port the pass to sim/core/wasm/assembly/step-kernel.ts in the same operation order,
//      `npm run build:wasm`, set `inWasmKernel: true`, add a row to the bit-identity table.
import type { Model } from '../model.ts';
import type { World } from '../world.ts';

export interface StepPass {
  /** What the pass does, for messages. */
  readonly name: string;
  /** Where the JavaScript kernel does it. */
  readonly jsFunction: string;
  readonly inWasmKernel: boolean;
  /** Fields this pass (or the model's bookkeeping around the step) reads. */
  readonly modelFields: readonly (keyof Model)[];
  readonly worldFields?: readonly string[];
  readonly optionFields?: readonly string[];
  /** Whether the JavaScript step runs the pass for this model and world. */
  usedBy(model: Model, world: World, options: Readonly<Record<string, unknown>>): boolean;
}

export const STEP_PASSES: readonly StepPass[] = [
  {
    name: 'kernel choice', jsFunction: 'Simulator constructor', inWasmKernel: true,
    modelFields: [], optionFields: ['kernel'], usedBy: () => true,
  },
  {
    name: 'node state and update (semi-implicit Euler)', jsFunction: 'simulator.ts updateVelocities, updatePositions, updateVelocitiesAndPositions', inWasmKernel: true,
    modelFields: ['nodeCount', 'positionM', 'velocityMPerS', 'inverseMassPerKg', 'nodeFlags'], usedBy: () => true,
  },
  {
    name: 'gravity, buoyancy and air drag', jsFunction: 'body-forces.ts writeBodyForces', inWasmKernel: true,
    modelFields: ['massKg', 'nodeVolumeM3'],
    worldFields: ['gravityMPerS2', 'airDragPerS', 'fluid.densityKgPerM3', 'fluid.buoyancy'], usedBy: () => true,
  },
  {
    name: 'springs', jsFunction: 'spring-forces.ts accumulateSpringForces', inWasmKernel: true,
    modelFields: ['springCount', 'springNodeA', 'springNodeB', 'restLengthM', 'stiffnessNPerM', 'dampingNsPerM'], usedBy: () => true,
  },
  {
    // Runs in JavaScript once per control interval in both kernels and writes rest lengths the
    // WebAssembly stepper copies in (WasmStepper.syncRestLengths).
    name: 'actuation', jsFunction: 'control-application.ts applyActuation', inWasmKernel: true,
    modelFields: ['actuationEntryCount', 'actuationSpring', 'actuationChannel', 'actuationGain', 'baseRestLengthM', 'controlChannelCount'], usedBy: () => true,
  },
  {
    name: 'hinge bending (elastic and damping)', jsFunction: 'bending-forces.ts accumulateBendingForces', inWasmKernel: true,
    modelFields: ['hingeCount', 'hingeNodes', 'hingeStiffnessNm', 'hingeDampingNms'], usedBy: (m) => m.hingeCount > 0,
  },
  {
    name: 'clamps (elastic and damping)', jsFunction: 'bending-forces.ts accumulateClampForces', inWasmKernel: true,
    modelFields: ['clampCount', 'clampNodes', 'clampDirectionUnit', 'clampStiffnessNm', 'clampDampingNms'], usedBy: (m) => m.clampCount > 0,
  },
  {
    name: 'fluid drag on panels', jsFunction: 'fluid-drag.ts accumulateFluidDrag', inWasmKernel: true,
    modelFields: ['panelNodeCount', 'panelCount', 'panelNodes', 'panelWidthM'],
    worldFields: ['fluid', 'fluid.enabled', 'fluid.normalDragNsPerM3', 'fluid.tangentialDragNsPerM3', 'fluid.flowVelocityMPerS'],
    usedBy: (m, w) => w.fluid.enabled && m.panelCount > 0,
  },
  {
    name: 'handle forces', jsFunction: 'simulator.ts Simulator.step (handles)', inWasmKernel: true,
    modelFields: ['handleNodes', 'handleForceChannel'], usedBy: (m) => m.handleNodes.length > 0,
  },
  {
    name: 'driven nodes', jsFunction: 'simulator.ts Simulator.advanceInterval/placeDrivenNodes', inWasmKernel: true,
    modelFields: ['drivenNodes', 'drivenOriginM', 'drivenOffsetChannel'], usedBy: (m) => m.drivenNodes.length > 0,
  },
  {
    name: 'ground contact with friction', jsFunction: 'ground-contact.ts projectGroundContact', inWasmKernel: true,
    modelFields: [], worldFields: ['ground', 'ground.enabled', 'ground.heightM', 'ground.staticFriction', 'ground.kineticFriction'],
    usedBy: (_m, w) => w.ground.enabled,
  },
  {
    name: 'obstacle contact (boxes, spheres, cylinders)', jsFunction: 'obstacle-contact.ts projectObstacleContact', inWasmKernel: false,
    modelFields: [], worldFields: ['obstacles'], usedBy: (_m, w) => w.obstacles.length > 0,
  },
  {
    name: 'energy ledger and force recording', jsFunction: 'step-ledger.ts StepLedger beginStep, afterForceUpdate, afterContact, afterSupportsMoved', inWasmKernel: false,
    modelFields: [], optionFields: ['ledger'], usedBy: (_m, _w, options) => options.ledger !== undefined,
  },
  {
    // Labels and cells for datasets and the energy measure; the step never reads them.
    name: 'labels and cells (not read by the step)', jsFunction: '—', inWasmKernel: true,
    modelFields: ['nodeMaterial', 'nodeChannel', 'springRelation', 'cellCornerCount', 'cellCount', 'cellCorners', 'cellMaterial', 'cellChannel'],
    usedBy: () => true,
  },
];

export type WasmKernelCoverage = { ok: true } | { ok: false; reason: string };

/** Whether the WebAssembly kernel can run this model in this world with these options. */
export function wasmKernelCoverage(
  model: Model, world: World, options: Readonly<Record<string, unknown>> = {}, passes: readonly StepPass[] = STEP_PASSES,
): WasmKernelCoverage {
  const claimed = claimedFields(passes);
  for (const key of Object.keys(model)) {
    if (!claimed.model.has(key)) return { ok: false, reason: `the model has "${key}", which no pass of the WebAssembly kernel claims` };
  }
  for (const path of worldPaths(world)) {
    if (!claimed.world.has(path)) return { ok: false, reason: `the world has "${path}", which no pass of the WebAssembly kernel claims` };
  }
  for (const [key, value] of Object.entries(options)) {
    if (value !== undefined && !claimed.option.has(key)) return { ok: false, reason: `Simulator option "${key}" is not implemented by the WebAssembly kernel` };
  }
  for (const pass of passes) {
    if (!pass.inWasmKernel && pass.usedBy(model, world, options)) {
      return { ok: false, reason: `the WebAssembly kernel has no ${pass.name} pass (${pass.jsFunction})` };
    }
  }
  return { ok: true };
}

/** Asked once per Simulator, so the sets are built per call. */
function claimedFields(passes: readonly StepPass[]): { model: Set<string>; world: Set<string>; option: Set<string> } {
  const model = new Set<string>();
  const world = new Set<string>();
  const option = new Set<string>();
  for (const pass of passes) {
    for (const f of pass.modelFields) model.add(f);
    for (const f of pass.worldFields ?? []) world.add(f);
    for (const f of pass.optionFields ?? []) option.add(f);
  }
  return { model, world, option };
}

/** The world's top-level keys and, for its plain-object members (ground, fluid), "member.key". */
function worldPaths(world: World): string[] {
  const paths: string[] = [];
  for (const [key, value] of Object.entries(world)) {
    paths.push(key);
    if (value !== null && typeof value === 'object' && !Array.isArray(value)) {
      for (const inner of Object.keys(value)) paths.push(`${key}.${inner}`);
    }
  }
  return paths;
}
