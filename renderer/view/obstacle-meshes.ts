// The static obstacles of a world drawn simply: flat-shaded solids with lined edges, in the
// ground's colour family so the body stays the thing to look at. Rebuilt when the world changes.
import * as THREE from 'three';

import type { Obstacle } from '../../sim/core/world.ts';

const OBSTACLE_COLOUR = 0xb9ae95;
const EDGE_COLOUR = 0x857b66;

function geometryOf(obstacle: Obstacle): THREE.BufferGeometry {
  if (obstacle.shape === 'box') {
    const h = obstacle.halfSizeM;
    return new THREE.BoxGeometry(2 * h[0], 2 * h[1], 2 * h[2]);
  }
  if (obstacle.shape === 'sphere') return new THREE.SphereGeometry(obstacle.radiusM, 32, 16);
  const cylinder = new THREE.CylinderGeometry(obstacle.radiusM, obstacle.radiusM, 2 * obstacle.halfLengthM, 32);
  // three.js cylinders lie along y; turn them onto their axis.
  if (obstacle.axis === 0) cylinder.rotateZ(Math.PI / 2);
  if (obstacle.axis === 2) cylinder.rotateX(Math.PI / 2);
  return cylinder;
}

/** Fills `group` with one mesh per obstacle, disposing what it held. */
export function fillObstacleGroup(group: THREE.Group, obstacles: readonly Obstacle[]): void {
  for (const child of [...group.children]) {
    group.remove(child);
    child.traverse((part) => {
      if (part instanceof THREE.Mesh || part instanceof THREE.LineSegments) {
        part.geometry.dispose();
        (part.material as THREE.Material).dispose();
      }
    });
  }
  for (const obstacle of obstacles) {
    const geometry = geometryOf(obstacle);
    const mesh = new THREE.Mesh(geometry, new THREE.MeshLambertMaterial({ color: OBSTACLE_COLOUR, transparent: true, opacity: 0.85 }));
    // Sphere and cylinder edges would line every facet; only boxes get their edges drawn.
    if (obstacle.shape === 'box') mesh.add(new THREE.LineSegments(new THREE.EdgesGeometry(geometry), new THREE.LineBasicMaterial({ color: EDGE_COLOUR })));
    mesh.position.set(obstacle.centerM[0], obstacle.centerM[1], obstacle.centerM[2]);
    group.add(mesh);
  }
}
