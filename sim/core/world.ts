// The environment a model moves in: gravity, air drag, an optional ground plane and an
// optional surrounding fluid. Plain data, SI units, shared by the integrator and the sampler.

export interface GroundSettings {
  enabled: boolean;
  /** Height of the horizontal plane y = heightM, m. The plane's normal is +y. */
  heightM: number;
  staticFriction: number;
  kineticFriction: number;
}

export interface FluidSettings {
  enabled: boolean;
  densityKgPerM3: number;
  /** Resistive-force coefficient for motion normal to a surface panel, N·s/m³. */
  normalDragNsPerM3: number;
  /** Resistive-force coefficient for motion along a surface panel, N·s/m³. */
  tangentialDragNsPerM3: number;
  /** Uniform flow velocity of the fluid, m/s. */
  flowVelocityMPerS: [number, number, number];
  /** Apply buoyancy ρ_fluid·V·(−g) to every node's displaced volume. */
  buoyancy: boolean;
}

/** Axis-aligned box, sphere, or cylinder along a coordinate axis; rigid and fixed in space. */
export type ObstacleShape = 'box' | 'sphere' | 'cylinder';

export interface Obstacle {
  shape: ObstacleShape;
  centerM: [number, number, number];
  /** Box: half the edge lengths along x, y, z, m. Unused for spheres and cylinders. */
  halfSizeM: [number, number, number];
  /** Sphere and cylinder radius, m. */
  radiusM: number;
  /** Cylinder: half its length along its axis, m. */
  halfLengthM: number;
  /** Cylinder axis: 0 x, 1 y, 2 z. */
  axis: 0 | 1 | 2;
  staticFriction: number;
  kineticFriction: number;
}

export interface World {
  gravityMPerS2: [number, number, number];
  /** Mass-proportional linear drag: F = −m·airDragPerS·v, 1/s. */
  airDragPerS: number;
  ground: GroundSettings;
  fluid: FluidSettings;
  /** Static rigid obstacles besides the ground plane; contact as for the ground. */
  obstacles: Obstacle[];
}

export function defaultWorld(): World {
  return {
    gravityMPerS2: [0, -9.81, 0],
    airDragPerS: 0,
    ground: { enabled: false, heightM: 0, staticFriction: 0.6, kineticFriction: 0.5 },
    fluid: {
      enabled: false,
      densityKgPerM3: 1000,
      normalDragNsPerM3: 0,
      tangentialDragNsPerM3: 0,
      flowVelocityMPerS: [0, 0, 0],
      buoyancy: false,
    },
    obstacles: [],
  };
}
