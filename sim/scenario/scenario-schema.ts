// The JSON Schema (draft 2020-12) of a scenario file: the single description of the format
// that the checker validates against, the app's editor completes from and the docs render.
// Structure, types, enums and per-value physical limits live here; what one value cannot say
// on its own (ranges against ranges, stability, sizes) is in physical-checks.ts.
import { controlSpecSchema } from '../controls/control-spec-schema.ts';
import { DEFAULT_RAMP_IN_S } from '../controls/ramp-in.ts';
import { DESIGN_KINDS } from '../design/design-spec.ts';
import { PARAMETER_NAME_PATTERN } from '../random/derived-expression.ts';
import type { JsonSchema } from '../random/value-spec-schema.ts';
import type { ValueSpecSchemaOptions } from '../random/value-spec-schema.ts';
import { VALUE_SPEC_DEFINITIONS, valueSpecSchema } from '../random/value-spec-schema.ts';
import { DEFAULT_EXPORT_COMPRESSION, describeCompression,EXPORT_COMPRESSIONS, SEED_COMPRESSION_BEFORE_CHOICE } from './export-compression.ts';
import { withFieldTitles } from './field-titles.ts';
import { SAFETY_CAUTION } from './safety-caution.ts';
import {
  MAX_ACTUATOR_CHANNELS,
  MAX_CHAIN_PARTS,
  MAX_DESCRIPTION_CHARS,
  MAX_DESIGN_BINS,
  MAX_EPISODES,
  MAX_LATTICE_MATERIALS,
  MAX_MATERIAL_NAME_CHARS,
  MAX_MATERIAL_TEMPLATES,
  MAX_MODE_COORDINATES,
  MAX_NAMED_PARAMETERS,
  MAX_NODES,
  MAX_NUMBER_SEED,
  MAX_OBSERVATION_MARKERS,
  MAX_OBSTACLES,
  MAX_RAMP_IN_S,
  MAX_RECORD_INTERVAL_S,
  MAX_RECORDED_STEPS,
  MAX_SETTLE_S,
  MAX_SUBSTEPS,
} from './scenario-limits.ts';

export const SCENARIO_SCHEMA_ID = 'https://pliant.invalid/schema/scenario-1.json';

function closed(description: string, properties: Record<string, JsonSchema>, required: string[]): JsonSchema {
  return { type: 'object', description, properties, required, additionalProperties: false };
}

function vector3(description: string, options: ValueSpecSchemaOptions = {}, defaultValue?: number[]): JsonSchema {
  const schema: JsonSchema = {
    type: 'array',
    description: `${description} Three entries [x, y, z], each a number or a distribution; y is up.`,
    minItems: 3,
    maxItems: 3,
    items: valueSpecSchema(`One component. ${description}`, options),
  };
  if (defaultValue !== undefined) schema.default = defaultValue;
  return schema;
}

const AXES = { type: 'string', enum: ['x', 'y', 'z'] };

const chainSchema = closed(
  'A chain of equal parts: a rope, cable or tether. Part j joins nodes j and j + 1; each part\'s mass is lumped half to each end.',
  {
    kind: { const: 'chain' },
    partCount: valueSpecSchema(`Number of parts (the chain has one node more), at most ${MAX_CHAIN_PARTS}.`, { integer: true, minimum: 1, maximum: MAX_CHAIN_PARTS }),
    lengthM: valueSpecSchema('Unstretched length of the whole chain, m.', { exclusiveMinimum: 0 }),
    totalMassKg: valueSpecSchema('Mass of the whole chain, kg.', { exclusiveMinimum: 0 }),
    axialStiffnessN: valueSpecSchema('Axial rigidity EA (Young\'s modulus times cross-section area), N.', { exclusiveMinimum: 0 }),
    secondNeighbourSpringRatio: valueSpecSchema('Stiffness of springs from node i to node i + 2 over the structural ones, dimensionless; 0 for none. They resist folding but give no bending stiffness about a straight line: use bendingStiffnessNm2 for that.', { minimum: 0, default: 0 }),
    bendingStiffnessNm2: valueSpecSchema('Bending rigidity EI, N·m² (for a solid round section EI = E·π·d⁴/64): a turning-angle hinge at every interior node; 0 for none.', { minimum: 0, default: 0 }),
    bendingDampingRatio: valueSpecSchema('Damping ratio of each bending hinge: of a node moving across the line through its two neighbours, dimensionless (1 is critical).', { minimum: 0, default: 0 }),
    clampedEnds: {
      type: 'array',
      items: { type: 'string', enum: ['top', 'bottom'] },
      uniqueItems: true,
      default: [],
      description: 'Ends held in position and direction (along directionUnit): "top" is node 0, "bottom" the last node. Needs bendingStiffnessNm2 > 0. A clamped top-driven node keeps its direction while it moves.',
    },
    pinnedNodes: {
      type: 'array',
      description: 'Further nodes held in place; negative indices count from the free end, -1 is the tip.',
      items: valueSpecSchema('Node index of a pinned node; negative counts from the free end.', { integer: true }),
      default: [],
    },
    dampingRatio: valueSpecSchema('Damping ratio of each spring with its two end masses, dimensionless (1 is critical).', { minimum: 0 }),
    diameterM: valueSpecSchema('Outer diameter, m: sets the drag width and the displaced volume.', { exclusiveMinimum: 0 }),
    anchor: {
      type: 'string',
      enum: ['top-pinned', 'both-pinned', 'free', 'top-driven'],
      description: 'What holds the chain: node 0 pinned, both ends pinned, nothing, or node 0 moved by control channels along drivenAxes.',
    },
    originM: vector3('Position of node 0 (the top), m.', {}, [0, 0, 0]),
    directionUnit: vector3('Direction the chain is laid out in from node 0, normalised before use.', {}, [0, -1, 0]),
    forceHandles: {
      type: 'array',
      description: 'Nodes pushed by control forces (one channel per handle and force axis); negative indices count from the free end, -1 is the tip.',
      items: valueSpecSchema('Node index of a handle; negative counts from the free end.', { integer: true }),
      default: [],
    },
    forceAxes: { type: 'array', items: AXES, uniqueItems: true, description: 'Axes along which every handle is pushed.', default: ['x', 'y', 'z'] },
    drivenAxes: { type: 'array', items: AXES, uniqueItems: true, description: 'Axes along which a top-driven node 0 and every node of drivenNodes follow their control channels.', default: ['x', 'y', 'z'] },
    drivenNodes: {
      type: 'array',
      description: 'Further nodes moved by control channels along drivenAxes ("<node>-offset-<axis>", e.g. "tip-offset-x" or "node4-offset-y", a displacement in m from the start); negative indices count from the free end, -1 is the tip.',
      items: valueSpecSchema('Node index of a driven node; negative counts from the free end.', { integer: true }),
      default: [],
    },
  },
  ['kind', 'partCount', 'lengthM', 'totalMassKg', 'axialStiffnessN', 'dampingRatio', 'diameterM', 'anchor'],
);

const materialIndex: JsonSchema = { type: 'integer', minimum: 0, description: '0 for an empty cell, m >= 1 for materials[m - 1].' };

const materialMapSchema: JsonSchema = {
  type: 'array',
  minItems: 1,
  description: 'A material map: 2-D as rows [y][x], 3-D as layers [y][z][x]; y is up and index 0 is the bottom. 0 is empty, m >= 1 is materials[m - 1].',
  items: {
    type: 'array',
    minItems: 1,
    description: 'A row of a 2-D map, or a layer of a 3-D map.',
    items: {
      type: ['integer', 'array'],
      description: 'A cell of a 2-D row, or a row of a 3-D layer.',
      if: { type: 'integer' },
      then: materialIndex,
      else: { type: 'array', minItems: 1, items: materialIndex },
    },
  },
};

const textRow: JsonSchema = { type: 'string', minLength: 1, description: 'One row of cells, one character per cell along x; "." is empty.' };
const legendSchema: JsonSchema = {
  type: 'object',
  minProperties: 1,
  propertyNames: { minLength: 1, maxLength: 2 },
  additionalProperties: { type: ['string', 'null'], minLength: 1 },
  description: 'Each character the rows use and the material it stands for, by its name in /system/materials (null: an empty cell). "." is empty without an entry.',
};

const textMaterialMapSchema: JsonSchema = {
  type: 'object',
  description: 'A material map drawn as text, written top first as the body looks: "rows" for 2-D, or "levels" for 3-D (each level a plan from above, one row per z).',
  if: { properties: { levels: {} }, required: ['levels'] },
  then: closed('A 3-D map drawn as text.', {
    legend: legendSchema,
    levels: { type: 'array', minItems: 1, items: { type: 'array', minItems: 1, items: textRow }, description: 'Levels from the top down; each a plan seen from above, rows z = 0, 1, … and characters along x.' },
  }, ['legend', 'levels']),
  else: closed('A 2-D map drawn as text.', {
    legend: legendSchema,
    rows: { type: 'array', minItems: 1, items: textRow, description: 'Rows from the top down, characters along x.' },
  }, ['legend', 'rows']),
};

const anyMaterialMapSchema: JsonSchema = {
  description: 'A material map: numbers (rows [y][x] or layers [y][z][x], bottom first) or text with a legend (top first, as the body looks).',
  if: { type: 'object' },
  then: textMaterialMapSchema,
  else: materialMapSchema,
};

const generatorSchema = closed(
  'Random face-connected bodies: grown cell by cell from a seed cell inside a box, each cell given a material by materialWeights.',
  {
    dimension: { type: 'integer', enum: [2, 3], description: '2 for square cells in the x-y plane, 3 for cubes.' },
    boundsCells: {
      type: 'array',
      minItems: 2,
      maxItems: 3,
      description: 'Size of the box the body grows in, cells along [x, y] (2-D) or [x, y, z] (3-D).',
      items: valueSpecSchema('Cells along one axis of the box.', { integer: true, minimum: 1 }),
    },
    cellCount: valueSpecSchema('Cells in the body, at most the number of cells in the box.', { integer: true, minimum: 1 }),
    materialWeights: {
      type: 'array',
      minItems: 1,
      description: 'Relative chance of each material per cell, one entry per material (not all zero).',
      items: valueSpecSchema('Relative chance of one material, dimensionless.', { minimum: 0 }),
    },
    actuatedChannelCount: valueSpecSchema(
      'When given, each cell of an actuated material (actuatorChannel not null) is driven by one of this many channels, each equally likely; otherwise cells keep their material\'s channel.',
      { integer: true, minimum: 0, maximum: MAX_ACTUATOR_CHANNELS },
    ),
  },
  ['dimension', 'boundsCells', 'cellCount', 'materialWeights'],
);

const shapeSchema: JsonSchema = {
  type: 'object',
  description: 'The body\'s cells: a list of material maps ("maps", one drawn per episode) or a random shape ("generator").',
  if: { properties: { generator: {} }, required: ['generator'] },
  then: closed('A random shape.', { generator: generatorSchema }, ['generator']),
  else: closed(
    'A list of material maps.',
    {
      maps: {
        type: 'array',
        minItems: 1,
        items: anyMaterialMapSchema,
        description: 'Material maps, one drawn per episode (equally likely unless "weights" is given); or give "generator" instead of "maps" for random shapes.',
      },
      weights: { type: 'array', items: { type: 'number', minimum: 0 }, description: 'Relative chance of each map, one per map (optional).' },
    },
    ['maps'],
  ),
};

const MATERIAL_NAME: JsonSchema = { type: 'string', minLength: 1, maxLength: MAX_MATERIAL_NAME_CHARS, description: 'Name shown in labels and channel descriptions.' };
const TEMPLATE_NAME_PATTERN = '^[A-Za-z][A-Za-z0-9_-]{0,31}$';

// The members a material and a template share. Defaults are filled only into plain materials:
// a default filled into a templated material would override the template's own value.
function materialMembers(withDefaults: boolean): Record<string, JsonSchema> {
  const members: Record<string, JsonSchema> = {
    youngsModulusPa: valueSpecSchema('Young\'s modulus, Pa.', { exclusiveMinimum: 0 }),
    densityKgPerM3: valueSpecSchema('Density, kg/m³ (2-D cells are one cell size thick).', { exclusiveMinimum: 0 }),
    dampingRatio: valueSpecSchema('Damping ratio of the cell\'s springs, dimensionless.', { minimum: 0 }),
    actuatorChannel: {
      type: ['integer', 'null'],
      minimum: 0,
      maximum: MAX_ACTUATOR_CHANNELS - 1,
      default: null,
      description: 'Control channel that actuates cells of this material, or null for a passive material.',
    },
    actuationStrainMax: valueSpecSchema('Largest relative change of rest length at a command of ±1, dimensionless.', { minimum: 0, maximum: 0.5, default: 0 }),
  };
  if (!withDefaults) {
    for (const member of Object.values(members)) delete member.default;
  }
  return members;
}

const MATERIAL_DESCRIPTION = 'A cell material. Stiffness comes from the Young\'s modulus by energy equivalence of the cell\'s springs (Poisson\'s ratio 1/4 in 3-D, 1/3 in 2-D).';

const plainMaterialSchema = closed(
  MATERIAL_DESCRIPTION,
  { name: MATERIAL_NAME, ...materialMembers(true) },
  ['name', 'youngsModulusPa', 'densityKgPerM3', 'dampingRatio'],
);

const templatedMaterialSchema = closed(
  `${MATERIAL_DESCRIPTION} This one starts from a template of /system/materialTemplates; the members given here replace the template's.`,
  {
    name: MATERIAL_NAME,
    template: { type: 'string', pattern: TEMPLATE_NAME_PATTERN, description: 'Name of the template in /system/materialTemplates this material starts from.' },
    ...materialMembers(false),
  },
  ['name', 'template'],
);

const materialSchema: JsonSchema = {
  type: 'object',
  description: `${MATERIAL_DESCRIPTION} Give "template" to start from a shared template and override only what differs.`,
  if: { properties: { template: {} }, required: ['template'] },
  then: templatedMaterialSchema,
  else: plainMaterialSchema,
};

const materialTemplatesSchema: JsonSchema = {
  type: 'object',
  description: 'Shared material members, by template name: a material {"name": ..., "template": "<name>", ...} takes every member of its template and replaces those it gives itself. Expanded into plain materials when the scenario is checked, so samples and the seed file show full materials.',
  propertyNames: { pattern: TEMPLATE_NAME_PATTERN },
  maxProperties: MAX_MATERIAL_TEMPLATES,
  additionalProperties: closed('A material template: any members of a material except its name.', materialMembers(false), []),
};

const latticeClampSchema = closed(
  'A group of lattice nodes held in place, or moved by control channels along drivenAxes (a shaking table). Give exactly one of face, cells and boxM.',
  {
    name: { type: 'string', pattern: '^[a-z][a-z0-9-]{0,31}$', description: 'Start of the group\'s channel names ("table" gives "table-offset-x"); default "clamp-<position in the list>".' },
    face: { type: 'string', enum: ['-x', '+x', '-y', '+y', '-z', '+z'], description: 'Every node on the body\'s outermost grid plane on that side (-y is the bottom; 2-D lattices have no z faces).' },
    cells: {
      type: 'array',
      minItems: 1,
      description: 'Every corner node of these cells, each given by its grid position [x, y] (2-D) or [x, y, z] (3-D), counting from 0 at the grid\'s minimum corner.',
      items: { type: 'array', minItems: 2, maxItems: 3, items: { type: 'integer', minimum: 0 }, description: 'Grid position of a filled cell.' },
    },
    boxM: closed('Every node whose built position lies inside this axis-aligned box (faces included), m.', {
      min: vector3('Minimum corner of the box, m.'),
      max: vector3('Maximum corner of the box, m.'),
    }, ['min', 'max']),
    drivenAxes: { type: 'array', items: AXES, uniqueItems: true, default: [], description: 'Axes along which the group follows its channels (one "<name>-offset-<axis>" channel each, a displacement in m from the built position); empty: the group is pinned.' },
  },
  [],
);

const latticeSchema = closed(
  'A soft body of square (2-D) or cubic (3-D) cells sharing corner nodes; actuated materials change their springs\' rest lengths with their channel.',
  {
    kind: { const: 'lattice' },
    cellSizeM: valueSpecSchema('Edge length of one cell, m.', { exclusiveMinimum: 0 }),
    shape: shapeSchema,
    materials: { type: 'array', minItems: 1, maxItems: MAX_LATTICE_MATERIALS, items: materialSchema, description: 'Materials, referred to by position (1 is the first); each one plain or started from a template of materialTemplates.' },
    materialTemplates: materialTemplatesSchema,
    base: { type: 'string', enum: ['clamped', 'free'], default: 'free', description: 'clamped: the bottom nodes of the lowest layer are pinned; free: nothing is pinned.' },
    originM: vector3('Position of the grid\'s minimum corner, m.', {}, [0, 0, 0]),
    clamps: { type: 'array', items: latticeClampSchema, default: [], description: 'Further node groups held in place or driven: faces, cells or boxes.' },
  },
  ['kind', 'cellSizeM', 'shape', 'materials'],
);

const systemSchema: JsonSchema = {
  type: 'object',
  description: 'The system family: "chain" (ropes, tethers) or "lattice" (soft bodies, fins, swimmers).',
  required: ['kind'],
  properties: { kind: { enum: ['chain', 'lattice'], description: 'Which builder makes the system.' } },
  allOf: [
    { if: { properties: { kind: { const: 'chain' } }, required: ['kind'] }, then: chainSchema },
    { if: { properties: { kind: { const: 'lattice' } }, required: ['kind'] }, then: latticeSchema },
  ],
};

const OBSTACLE_COMMON = {
  centerM: vector3('Centre of the obstacle, m.'),
  staticFriction: valueSpecSchema('Static friction coefficient of contact with the obstacle, dimensionless.', { minimum: 0 }),
  kineticFriction: valueSpecSchema('Kinetic friction coefficient, dimensionless; at most the static one.', { minimum: 0 }),
};

const obstacleSchema: JsonSchema = {
  type: 'object',
  description: 'A static rigid obstacle: an axis-aligned box, a sphere, or a cylinder along x, y or z. Nodes touching it get the ground\'s contact: no penetration, no bounce, Coulomb friction.',
  required: ['shape'],
  properties: { shape: { enum: ['box', 'sphere', 'cylinder'], description: 'Which solid.' } },
  allOf: [
    { if: { properties: { shape: { const: 'box' } }, required: ['shape'] }, then: closed('An axis-aligned box.', { shape: { const: 'box' }, ...OBSTACLE_COMMON, sizeM: vector3('Edge lengths along x, y and z, m.', { exclusiveMinimum: 0 }) }, ['shape', 'centerM', 'sizeM', 'staticFriction', 'kineticFriction']) },
    { if: { properties: { shape: { const: 'sphere' } }, required: ['shape'] }, then: closed('A sphere.', { shape: { const: 'sphere' }, ...OBSTACLE_COMMON, radiusM: valueSpecSchema('Radius, m.', { exclusiveMinimum: 0 }) }, ['shape', 'centerM', 'radiusM', 'staticFriction', 'kineticFriction']) },
    {
      if: { properties: { shape: { const: 'cylinder' } }, required: ['shape'] },
      then: closed('A solid cylinder with flat ends.', {
        shape: { const: 'cylinder' },
        ...OBSTACLE_COMMON,
        radiusM: valueSpecSchema('Radius, m.', { exclusiveMinimum: 0 }),
        lengthM: valueSpecSchema('Length along its axis, m.', { exclusiveMinimum: 0 }),
        axis: { ...AXES, default: 'y', description: 'Axis the cylinder lies along.' },
      }, ['shape', 'centerM', 'radiusM', 'lengthM', 'staticFriction', 'kineticFriction']),
    },
  ],
};

const worldSchema = closed(
  'The surroundings: gravity, air drag, an optional ground plane and an optional fluid.',
  {
    gravityMPerS2: vector3('Gravitational acceleration, m/s².', {}, [0, -9.81, 0]),
    airDragPerS: valueSpecSchema('Mass-proportional linear drag F = -m·rate·v, 1/s.', { minimum: 0, default: 0 }),
    ground: closed(
      'A horizontal ground plane y = heightM with Coulomb friction; leave out for none.',
      {
        heightM: valueSpecSchema('Height of the plane, m.', { default: 0 }),
        staticFriction: valueSpecSchema('Static friction coefficient, dimensionless.', { minimum: 0 }),
        kineticFriction: valueSpecSchema('Kinetic friction coefficient, dimensionless; at most the static one.', { minimum: 0 }),
      },
      ['staticFriction', 'kineticFriction'],
    ),
    fluid: closed(
      'A surrounding fluid with resistive-force drag on surface panels; leave out for none.',
      {
        densityKgPerM3: valueSpecSchema('Fluid density, kg/m³ (fresh water about 1000).', { exclusiveMinimum: 0 }),
        normalDragNsPerM3: valueSpecSchema('Drag coefficient for motion across a panel, N·s/m³.', { minimum: 0 }),
        tangentialDragNsPerM3: valueSpecSchema('Drag coefficient for motion along a panel, N·s/m³.', { minimum: 0 }),
        flowVelocityMPerS: vector3('Uniform flow velocity, m/s.', {}, [0, 0, 0]),
        buoyancy: { type: 'boolean', default: true, description: 'Apply buoyancy to every node\'s displaced volume.' },
      },
      ['densityKgPerM3', 'normalDragNsPerM3', 'tangentialDragNsPerM3'],
    ),
    obstacles: { type: 'array', items: obstacleSchema, default: [], maxItems: MAX_OBSTACLES, description: `Static rigid obstacles besides the ground plane, at most ${MAX_OBSTACLES}; nodes do not collide with each other.` },
  },
  [],
);

// The control spec is large and used for every channel: written once, referenced by each.
const CONTROL_SPEC_REF = '#/$defs/controlSpec';

const controlsSchema = closed(
  'Control signals per channel. Channel names come from the system (e.g. "top-offset-x", "force-tip-y", "actuator-0").',
  {
    default: { $ref: CONTROL_SPEC_REF, description: 'Signal of every channel not named in "channels".', default: { kind: 'none' } },
    channels: {
      type: 'object',
      description: 'Signals by channel name, or by channel index written as a string ("0").',
      additionalProperties: { $ref: CONTROL_SPEC_REF },
      default: {},
    },
    rampInS: {
      type: 'number',
      minimum: 0,
      maximum: MAX_RAMP_IN_S,
      default: DEFAULT_RAMP_IN_S,
      description: `Every channel's signal (after its clip) is multiplied by a raised-cosine ramp ½(1 − cos(π·t/rampInS)) from 0 to 1 over the first rampInS seconds, so episodes start smoothly from the built state instead of with a jolt; 0 turns it off. Replayed tables are used as written, without the ramp. Default ${DEFAULT_RAMP_IN_S} s.`,
    },
  },
  [],
);

const timeSchema = closed(
  'Recording: the record interval, the number of records and the integration sub-steps; fixed for the whole sweep so every episode has the same time base.',
  {
    recordIntervalS: { type: 'number', exclusiveMinimum: 0, maximum: MAX_RECORD_INTERVAL_S, description: 'Time between records (and between control updates), s.' },
    recordedSteps: { type: 'integer', minimum: 1, maximum: MAX_RECORDED_STEPS, description: 'Records per episode after the initial state.' },
    substeps: {
      type: ['integer', 'string', 'object'],
      default: 'auto',
      description: `Integration sub-steps per record interval: "auto" (from the stability bound), {"accuracy": ε} ("auto", or more so that the fastest mode's energy swings within a relative band ε: ω_max·dt ≤ ε), or a whole number from 1 to ${MAX_SUBSTEPS}.`,
      if: { type: 'string' },
      then: { enum: ['auto'] },
      else: {
        if: { type: 'object' },
        then: closed('Sub-steps for a target accuracy.', {
          accuracy: { type: 'number', exclusiveMinimum: 0, maximum: 1, description: 'Target relative energy band (peak to peak over the energy) of the fastest mode, e.g. 0.05; sub-steps are at least those of "auto".' },
        }, ['accuracy']),
        else: { minimum: 1, maximum: MAX_SUBSTEPS },
      },
    },
    autoSafety: { type: 'number', exclusiveMinimum: 0, maximum: 1, default: 0.5, description: 'Fraction of the critical time step that "auto" sub-steps stay within.' },
  },
  ['recordIntervalS', 'recordedSteps'],
);

const BEND_DIRECTION = vector3('Direction the chain bends towards, made perpendicular to the chain\'s direction (/system/directionUnit) before use; with it, it spans the plane of the curve.', {}, [1, 0, 0]);

const startCurveSchema: JsonSchema = {
  type: 'object',
  description: 'Chains only: the start shape as a planar curve instead of a straight line. Node 0 stays where it is and every further node is placed on the curve one part length (a chord) after the one before, so the structural springs start at their rest length; bending hinges and second-neighbour springs start bent. Applied before the rotation, settling and mode.',
  required: ['kind'],
  properties: { kind: { enum: ['arc', 'sine'], description: '"arc": a circle of given curvature tangent to the chain at node 0; "sine": a sideways sine wave along the chain\'s direction.' } },
  allOf: [
    {
      if: { properties: { kind: { const: 'arc' } }, required: ['kind'] },
      then: closed('A circular arc.', {
        kind: { const: 'arc' },
        curvaturePerM: valueSpecSchema('Curvature 1/R of the circle, 1/m; negative bends away from bendDirectionUnit, 0 is straight. At most 2 over the part length (a part is a chord of the circle).'),
        bendDirectionUnit: BEND_DIRECTION,
      }, ['kind', 'curvaturePerM']),
    },
    {
      if: { properties: { kind: { const: 'sine' } }, required: ['kind'] },
      then: closed('A sine-shaped bend: sideways offset A·(sin(2π·u/λ + φ) − sin φ) at distance u along the chain\'s direction, so node 0 stays on the line.', {
        kind: { const: 'sine' },
        amplitudeM: valueSpecSchema('Amplitude A of the sideways offset, m.'),
        wavelengthM: valueSpecSchema('Wavelength λ along the chain\'s direction, m.', { exclusiveMinimum: 0 }),
        phaseRad: valueSpecSchema('Phase φ of the sine at node 0, rad.', { default: 0 }),
        bendDirectionUnit: BEND_DIRECTION,
      }, ['kind', 'amplitudeM', 'wavelengthM']),
    },
  ],
};

const modeStartSchema = closed(
  `Start displaced along one of the system's own normal modes: the model is linearised about its state after the curve, rotation and settling (springs exactly, bending hinges by central differences; gravity adds no stiffness but sets the tensions), its modes found from M^(-1/2)·K·M^(-1/2) over the free nodes' coordinates along "axes" (at most ${MAX_MODE_COORDINATES} coordinates), and mode "index" added to the positions. Velocities stay as they are: zero unless velocityMPerS or spinRadPerS are given.`,
  {
    index: valueSpecSchema('Which mode: 1 is the slowest mode with a restoring stiffness (rigid-body motions and other zero modes, below 1e-12 of the largest eigenvalue, are skipped).', { integer: true, minimum: 1, maximum: MAX_MODE_COORDINATES }),
    amplitudeM: valueSpecSchema('Largest displacement of any node, m. Positive: the first noticeably moving coordinate (node by node, x before y before z) moves in +; negative: the mirror start.'),
    axes: { type: 'array', items: AXES, uniqueItems: true, minItems: 1, default: ['x', 'y', 'z'], description: 'Axes whose coordinates take part; the others are held while linearising. A chain along y with ["x", "y"] moves in the x-y plane only, which also picks one of each pair of equal sideways modes. 2-D lattices ignore z.' },
  },
  ['index', 'amplitudeM'],
);

const initialStateSchema = closed(
  'The start state: an optional curved shape (chains), a pose (rotation, translation) of the built shape, an optional settling under gravity before recording, an optional normal-mode displacement, a uniform start velocity and spin, then noise. Pinned and driven nodes are never moved.',
  {
    curve: startCurveSchema,
    mode: modeStartSchema,
    rotationRad: valueSpecSchema('Rigid rotation of the start pose, rad, about rotationAxisUnit through the first pinned or driven node (a chain\'s top: the chain starts at this angle), or through the centre of mass of a body with none. 2-D lattices turn about z.', { default: 0 }),
    rotationAxisUnit: vector3('Axis of the start rotation, normalised before use.', {}, [0, 0, 1]),
    translationM: vector3('Shift of the start pose of a body with no pinned or driven node, m.', {}, [0, 0, 0]),
    settleS: valueSpecSchema('Seconds the system relaxes under its world (controls at 0, extra drag settleDragPerS) before recording starts, so hanging or resting bodies start at rest; 0 for none. Velocities are zeroed afterwards.', { minimum: 0, maximum: MAX_SETTLE_S, default: 0 }),
    settleDragPerS: valueSpecSchema('Extra mass-proportional drag while settling, 1/s (about twice the slowest mode\'s angular frequency settles it fastest).', { minimum: 0, default: 10 }),
    velocityMPerS: vector3('Uniform start velocity of every free node, m/s (after settling).', {}, [0, 0, 0]),
    spinRadPerS: vector3('Start angular velocity about the rotation pivot, rad/s: each free node gets ω × (x − pivot) on top of velocityMPerS.', {}, [0, 0, 0]),
    positionNoiseM: valueSpecSchema('Standard deviation of normal noise on each coordinate of every free node, m.', { minimum: 0, default: 0 }),
    velocityNoiseMPerS: valueSpecSchema('Standard deviation of normal noise on each velocity component of every free node, m/s.', { minimum: 0, default: 0 }),
  },
  [],
);

const fraction = (description: string): JsonSchema => ({ type: 'number', minimum: 0, maximum: 1, default: 0, description });

const heldOutRuleSchema = closed(
  'Sends every episode whose sampled parameter matches to its own split, before the fractions are applied. above and below are strict; inside includes both ends; several conditions must all hold.',
  {
    split: { type: 'string', pattern: '^[a-z][a-z0-9-]{0,31}$', default: 'held-out', description: 'Name of the split, lower-case letters, digits and "-", e.g. "held-out".' },
    parameter: { type: 'string', pattern: '^/', description: 'JSON pointer of a sampled parameter, e.g. "/system/partCount".' },
    above: { type: 'number', description: 'Matches values above this.' },
    below: { type: 'number', description: 'Matches values below this.' },
    inside: { type: 'array', minItems: 2, maxItems: 2, items: { type: 'number' }, description: 'Matches values in [a, b].' },
  },
  ['parameter'],
);

const splitsSchema = closed(
  'How episodes are split.',
  {
    fractions: {
      ...closed('Share of the episodes (other than held-out ones) in each split; they sum to 1.', {
        train: fraction('Share for training.'),
        validation: fraction('Share for validation.'),
        test: fraction('Share for testing.'),
      }, []),
      default: { train: 0.8, validation: 0.1, test: 0.1 },
    },
    heldOut: { type: 'array', items: heldOutRuleSchema, default: [], description: 'Rules checked in order; the first match decides.' },
    counts: {
      ...closed('Exact numbers of episodes (other than held-out ones) per split, instead of fractions. Leave out at most one split: it takes the rest. Given all three, they must add up to the episodes left after the held-out rules.', {
        train: { type: 'integer', minimum: 0, maximum: MAX_EPISODES, description: 'Episodes for training.' },
        validation: { type: 'integer', minimum: 0, maximum: MAX_EPISODES, description: 'Episodes for validation.' },
        test: { type: 'integer', minimum: 0, maximum: MAX_EPISODES, description: 'Episodes for testing.' },
      }, []),
      minProperties: 1,
    },
    stratify: closed(
      'Deal the splits stratum by stratum so each split spans the listed parameters\' ranges: each parameter is cut into "bins" strata of equal episode counts, and within every combination of strata the splits keep their shares (counts, or the fractions rounded to whole episodes).',
      {
        parameters: { type: 'array', minItems: 1, uniqueItems: true, items: { type: 'string', pattern: '^/' }, description: 'JSON pointers of distributed parameters, e.g. ["/system/lengthM"].' },
        bins: { type: 'integer', minimum: 1, maximum: MAX_DESIGN_BINS, description: 'Strata per parameter; 4 when left out.' },
      },
      ['parameters'],
    ),
  },
  [],
);

const exportSchema = closed(
  'Dataset files.',
  {
    format: { type: 'string', enum: ['npz', 'hdf5', 'both'], default: 'npz', description: 'NPZ (zipped NPY arrays), HDF5, or both.' },
    dtype: { type: 'string', enum: ['float32', 'float64'], default: 'float32', description: 'Floating-point type of the recorded arrays.' },
    forces: { type: 'boolean', default: false, description: 'Also store forces averaged over each record interval (impulse / interval): edge_tension, contact_normal_force, contact_friction_force, fluid_force.' },
    compression: {
      type: 'string',
      enum: [...EXPORT_COMPRESSIONS],
      default: DEFAULT_EXPORT_COMPRESSION,
      description: `How hard the data files are compressed; every choice loads with numpy.load and h5py and gives the same bytes on every run. ${EXPORT_COMPRESSIONS.map(describeCompression).join('. ')}. A seed file without this key regenerates with "${SEED_COMPRESSION_BEFORE_CHOICE}", the levels used before the choice existed.`,
    },
  },
  [],
);

const numericsSchema = closed(
  'Numerical-error estimates per episode, stored as labels under /numerics/ in the manifest.',
  {
    energyBalance: { type: 'boolean', default: false, description: 'Book every force\'s work and the contact losses: the energy_flows array and the energy balance labels. Off by default: it makes each sub-step some 2 to 4 times as long in the demo scenarios.' },
    richardsonShare: { type: 'number', minimum: 0, maximum: 1, default: 0, description: 'Share of episodes (drawn from each episode\'s own stream) rerun at half the sub-step for a Richardson estimate of the position error.' },
  },
  [],
);

const designSchema = closed(
  'How the episodes are placed in the space of distributed parameters (every value given as a distribution, in the order of their JSON pointers). Leave out for independent draws per episode. The design\'s unit-cube coordinate of each parameter goes through that parameter\'s distribution (inverse CDF), so the distributions keep their meaning. Control-signal parameters are always drawn independently.',
  {
    kind: {
      type: 'string',
      enum: [...DESIGN_KINDS],
      description: 'independent: each episode draws each parameter on its own; grid: every combination of the levels in "levels", one episode each; latin-hypercube: each parameter\'s range cut into as many equally likely strata as episodes, each used once (McKay, Beckman & Conover 1979); sobol: a scrambled Sobol sequence (Joe & Kuo 2008 direction numbers, linear matrix scramble and digital shift from the seed).',
    },
    levels: {
      type: 'object',
      description: 'Grid only: number of levels of each gridded parameter, keyed by its JSON pointer, e.g. {"/system/lengthM": 5}. The product must equal "episodes". Distributed parameters not named here are drawn independently.',
      propertyNames: { pattern: '^/' },
      additionalProperties: { type: 'integer', minimum: 1, maximum: MAX_EPISODES },
    },
  },
  ['kind'],
);

const markersSchema: JsonSchema = {
  type: 'object',
  description: 'Which nodes the sensor sees: {"nodes": [...]} lists them, {"everyNth": k} takes nodes 0, k, 2k, ...',
  if: { properties: { everyNth: {} }, required: ['everyNth'] },
  then: closed('Every k-th node, starting at node 0.', {
    everyNth: { type: 'integer', minimum: 1, maximum: MAX_NODES, description: 'Step k between observed node indices, counted in nodes.' },
  }, ['everyNth']),
  else: closed('Listed nodes.', {
    nodes: {
      type: 'array',
      minItems: 1,
      maxItems: MAX_OBSERVATION_MARKERS,
      uniqueItems: true,
      items: { type: 'integer', description: 'Node index of one marker; negative counts from the last node, -1 is the last.' },
      description: 'Node index of each marker, in the order of the observed arrays; or give "everyNth" instead.',
    },
  }, ['nodes']),
  default: { everyNth: 1 },
};

const observationSchema = closed(
  'What a position sensor records, stored beside the ground truth (which stays as it is): a subset of nodes, a lower frame rate, a fixed latency, Gaussian noise and dropouts, drawn from each episode\'s own random streams. Leave out for none. Give at most one of frameStride and rateHz; neither observes every record.',
  {
    markers: markersSchema,
    positionNoiseM: valueSpecSchema('Standard deviation of the Gaussian noise on each coordinate of each observed position, m.', { minimum: 0, default: 0 }),
    frameStride: { type: 'integer', minimum: 1, maximum: MAX_RECORDED_STEPS, description: 'Records per observed frame, counted in records: the sensor sees records 0, k, 2k, ...' },
    rateHz: { type: 'number', exclusiveMinimum: 0, description: 'Observed frames per second, Hz; must be the record rate (1 / recordIntervalS) divided by a whole number.' },
    latencyS: { type: 'number', minimum: 0, default: 0, description: 'Delay of every observation, s: the frame reported at time t shows the state at t - latencyS. A whole number of record intervals.' },
    dropoutProbability: valueSpecSchema('Chance that a marker is missing from one frame, dimensionless, independently per frame and marker.', { minimum: 0, exclusiveMaximum: 1, default: 0 }),
  },
  [],
);

const paramsSchema: JsonSchema = {
  type: 'object',
  description: `Named parameters, each defined once and used by pointer: {"ref": "/params/<name>"} anywhere a number goes takes its value, {"expr": "2 * /params/<name>"} a value derived from it. Each is a number, a distribution drawn once per episode from its own random stream (keyed by "/params/<name>", like any other place), or itself a ref or expr of other parameters. At most ${MAX_NAMED_PARAMETERS}; names are a letter, then letters, digits or "_".`,
  propertyNames: { pattern: PARAMETER_NAME_PATTERN },
  maxProperties: MAX_NAMED_PARAMETERS,
  additionalProperties: valueSpecSchema('A named parameter, in the unit of the places that use it.'),
};

// withFieldTitles: every member gets its short label ("Length" for lengthM) as its title.
export const SCENARIO_SCHEMA: JsonSchema = withFieldTitles({
  $schema: 'https://json-schema.org/draft/2020-12/schema',
  $id: SCENARIO_SCHEMA_ID,
  title: 'Pliant scenario',
  description: `A family of mass-spring or voxel systems to sample, simulate and record as a dataset. SI units throughout. Any physical number may be a constant or a distribution {"kind": "uniform" | "log-uniform" | "normal" | "integer" | "categorical", ...} drawn once per episode, or {"ref": "/params/<name>"} or {"expr": "2 * /params/<name>"} of the named parameters under "params". ${SAFETY_CAUTION}`,
  type: 'object',
  properties: {
    $schema: { type: 'string', description: 'Optional: where an editor finds this schema.' },
    formatVersion: { const: 1, description: 'Version of the scenario format; this Pliant reads 1.' },
    name: {
      type: 'string',
      pattern: '^[A-Za-z0-9][A-Za-z0-9._-]{0,63}$',
      description: 'Short name used in file names: letters, digits, ".", "_" and "-", starting with a letter or digit, at most 64 characters.',
    },
    description: { type: 'string', maxLength: MAX_DESCRIPTION_CHARS, default: '', description: 'What the sweep is for; copied into the dataset card.' },
    params: paramsSchema,
    system: systemSchema,
    world: { ...worldSchema, default: {} },
    controls: { ...controlsSchema, default: {} },
    time: timeSchema,
    initialState: { ...initialStateSchema, default: {} },
    episodes: { type: 'integer', minimum: 1, maximum: MAX_EPISODES, description: `Number of episodes to draw, at most ${MAX_EPISODES}.` },
    seed: {
      type: ['integer', 'string'],
      description: `Master seed: a whole number from 0 to ${MAX_NUMBER_SEED} (2^53 - 1), or a decimal string up to "18446744073709551615" (2^64 - 1).`,
      if: { type: 'integer' },
      then: { minimum: 0, maximum: MAX_NUMBER_SEED },
      else: { pattern: '^(0|[1-9][0-9]{0,19})$' },
    },
    splits: { ...splitsSchema, default: {} },
    export: { ...exportSchema, default: {} },
    observation: observationSchema,
    design: designSchema,
    maxRejectedFraction: {
      type: 'number',
      minimum: 0,
      maximum: 1,
      description: 'Largest share of the episodes of a run (or shard) that may be rejected as unstable; beyond it generation stops with exit code 2 and names the parameter ranges the rejected episodes come from. 0.5 when left out; 1 never stops.',
    },
    numerics: { ...numericsSchema, default: {} },
  },
  required: ['formatVersion', 'name', 'system', 'time', 'episodes', 'seed'],
  additionalProperties: false,
  // Last, so that every valueSpecSchema above has put its definition in by now.
  $defs: { controlSpec: controlSpecSchema, ...VALUE_SPEC_DEFINITIONS },
});
