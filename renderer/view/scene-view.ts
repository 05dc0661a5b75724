// The 3-D stage every screen shares: a WebGL renderer on one canvas, an orbit camera, light,
// the ground plane and the fluid volume of the world, and one body at a time. It renders only
// when something changed (a new frame, a camera move, a resize), so an idle screen costs nothing.
import * as THREE from 'three';
import { OrbitControls } from 'three/examples/jsm/controls/OrbitControls.js';

import type { BodyBounds } from './body-view.ts';
import { BodyView } from './body-view.ts';
import { fillObstacleGroup } from './obstacle-meshes.ts';
import { isSoftwareRendering } from './software-rendering.ts';
import type { StageWorld } from './stage-world.ts';

export type { StageWorld } from './stage-world.ts';

export const STAGE_BACKGROUND = 0xf4f1ea;
/** One key press turns or tilts the camera this much, rad (10°). */
const KEY_ORBIT_STEP_RAD = Math.PI / 18;
/** One key press moves the camera this factor closer or further. */
const KEY_ZOOM_FACTOR = 1.15;

export class SceneView {
  readonly canvas: HTMLCanvasElement;
  private readonly renderer: THREE.WebGLRenderer;
  private readonly scene = new THREE.Scene();
  private readonly camera = new THREE.PerspectiveCamera(40, 1, 0.001, 1000);
  private readonly controls: OrbitControls;
  private readonly ground: THREE.Mesh;
  private readonly groundGrid: THREE.GridHelper;
  private readonly fluid: THREE.Mesh;
  private readonly obstacles = new THREE.Group();
  private body: BodyView | null = null;
  private overlay: BodyView | null = null;
  /** Time spent issuing draw calls, ms, and how many renders it covers (for the draw-rate readout). */
  renderMsTotal = 0;
  renderCount = 0;
  private renderQueued = false;
  private readonly resizeObserver: ResizeObserver;

  constructor(readonly host: HTMLElement) {
    this.canvas = document.createElement('canvas');
    this.canvas.className = 'stage-canvas';
    this.canvas.tabIndex = 0;
    this.canvas.setAttribute('aria-label', '3-D view: drag or A, D, W, S to orbit; scroll or + and − to zoom');
    this.canvas.setAttribute('aria-keyshortcuts', 'A D W S + -');
    this.canvas.addEventListener('keydown', (event) => this.onKey(event));
    host.append(this.canvas);
    // preserveDrawingBuffer keeps the last frame readable for snapshots and pixel checks.
    this.renderer = new THREE.WebGLRenderer({ canvas: this.canvas, antialias: !isSoftwareRendering(), preserveDrawingBuffer: true });
    // Colours are given as display values so the legend's CSS colours and the drawn ones match.
    this.renderer.outputColorSpace = THREE.LinearSRGBColorSpace;
    this.renderer.setPixelRatio(Math.min(2, window.devicePixelRatio || 1));
    this.scene.background = new THREE.Color(STAGE_BACKGROUND);

    this.scene.add(new THREE.HemisphereLight(0xffffff, 0x8a8577, 2.2));
    const sun = new THREE.DirectionalLight(0xffffff, 1.2);
    sun.position.set(1, 2, 1.5);
    this.scene.add(sun);

    this.ground = new THREE.Mesh(
      new THREE.PlaneGeometry(1, 1),
      new THREE.MeshBasicMaterial({ color: 0xd9d2c0, side: THREE.DoubleSide, transparent: true, opacity: 0.9, depthWrite: false }),
    );
    this.ground.rotation.x = -Math.PI / 2;
    this.groundGrid = new THREE.GridHelper(1, 20, 0xa79f8a, 0xc4bca8);
    // The fluid is drawn as a tinted tank around the body: its far walls shaded, its edges lined.
    const box = new THREE.BoxGeometry(1, 1, 1);
    this.fluid = new THREE.Mesh(box, new THREE.MeshBasicMaterial({ color: 0x7fb3d6, transparent: true, opacity: 0.22, depthWrite: false, side: THREE.BackSide }));
    this.fluid.add(new THREE.LineSegments(new THREE.EdgesGeometry(box), new THREE.LineBasicMaterial({ color: 0x4f86ad })));
    this.scene.add(this.ground, this.groundGrid, this.fluid, this.obstacles);
    this.setWorld({ ground: { enabled: false, heightM: 0 }, fluid: { enabled: false } });

    this.controls = new OrbitControls(this.camera, this.canvas);
    this.controls.enableDamping = false;
    this.controls.addEventListener('change', () => this.requestRender());

    this.resizeObserver = new ResizeObserver(() => this.resize());
    this.resizeObserver.observe(host);
    this.resize();
  }

  /** Replaces the body; the old one is disposed. */
  setBody(body: BodyView | null): void {
    if (this.body) {
      this.scene.remove(this.body.group);
      this.body.dispose();
    }
    this.body = body;
    if (body) this.scene.add(body.group);
    this.requestRender();
  }

  /** Adds a second body drawn with the first (the recorded motion under a prediction); null removes it. */
  setOverlay(body: BodyView | null): void {
    if (this.overlay) {
      this.scene.remove(this.overlay.group);
      this.overlay.dispose();
    }
    this.overlay = body;
    if (body) this.scene.add(body.group);
    this.requestRender();
  }

  setWorld(world: StageWorld): void {
    this.ground.visible = world.ground.enabled;
    this.groundGrid.visible = world.ground.enabled;
    this.ground.position.y = world.ground.heightM;
    this.groundGrid.position.y = world.ground.heightM + 1e-4;
    this.fluid.visible = world.fluid.enabled;
    const obstacles = world.obstacles ?? [];
    fillObstacleGroup(this.obstacles, obstacles);
    this.host.setAttribute('data-obstacles', String(obstacles.length));
    this.host.setAttribute('data-ground', world.ground.enabled ? String(world.ground.heightM) : 'none');
    this.host.setAttribute('data-fluid', String(world.fluid.enabled));
    this.requestRender();
  }

  /**
   * Points the camera at the bounds (with the margin the body may move through) and sizes the
   * ground and the fluid volume to match.
   */
  frame(bounds: BodyBounds, groundHeightM: number): void {
    const [x0, y0, z0] = bounds.minM;
    const [x1, y1, z1] = bounds.maxM;
    const size = Math.max(x1 - x0, y1 - y0, z1 - z0, 1e-3);
    const cx = 0.5 * (x0 + x1);
    const cy = 0.5 * (y0 + y1);
    const cz = 0.5 * (z0 + z1);
    const extent = 3 * size;
    this.ground.scale.set(extent, extent, 1);
    this.ground.position.set(cx, groundHeightM, cz);
    this.groundGrid.scale.set(extent, 1, extent);
    this.groundGrid.position.set(cx, groundHeightM + 1e-4 * size, cz);
    this.fluid.scale.set(size + (x1 - x0), size + (y1 - y0), size + (z1 - z0));
    this.fluid.position.set(cx, cy, cz);
    this.controls.target.set(cx, cy, cz);
    const distance = (0.9 * size) / Math.tan((this.camera.fov * Math.PI) / 360);
    this.camera.position.set(cx + 0.55 * distance, cy + 0.35 * distance, cz + 0.75 * distance);
    this.camera.near = distance / 1000;
    this.camera.far = distance * 100;
    this.camera.updateProjectionMatrix();
    this.controls.update();
    this.requestRender();
  }

  /** Keyboard orbit and zoom on the focused view: A/D turn it, W/S tilt it, + and − zoom. */
  private onKey(event: KeyboardEvent): void {
    if (event.ctrlKey || event.metaKey || event.altKey) return;
    const step = KEY_ORBIT_STEP_RAD;
    const moves: Record<string, [number, number, number]> = {
      a: [-step, 0, 1], d: [step, 0, 1], w: [0, -step, 1], s: [0, step, 1],
      '+': [0, 0, 1 / KEY_ZOOM_FACTOR], '=': [0, 0, 1 / KEY_ZOOM_FACTOR], '-': [0, 0, KEY_ZOOM_FACTOR],
    };
    const move = moves[event.key.toLowerCase()];
    if (!move) return;
    event.preventDefault();
    const offset = this.camera.position.clone().sub(this.controls.target);
    const spherical = new THREE.Spherical().setFromVector3(offset);
    spherical.theta += move[0];
    spherical.phi = Math.min(Math.PI - 0.05, Math.max(0.05, spherical.phi + move[1]));
    spherical.radius *= move[2];
    this.camera.position.copy(this.controls.target).add(new THREE.Vector3().setFromSpherical(spherical));
    this.camera.lookAt(this.controls.target);
    this.controls.update();
    this.requestRender();
  }

  requestRender(): void {
    if (this.renderQueued) return;
    this.renderQueued = true;
    requestAnimationFrame(this.renderNow);
  }

  dispose(): void {
    this.resizeObserver.disconnect();
    this.controls.dispose();
    this.setBody(null);
    this.renderer.dispose();
    this.canvas.remove();
  }

  private readonly renderNow = (): void => {
    this.renderQueued = false;
    const startMs = performance.now();
    this.renderer.render(this.scene, this.camera);
    this.renderMsTotal += performance.now() - startMs;
    this.renderCount++;
  };

  private resize(): void {
    const width = Math.max(1, this.host.clientWidth);
    const height = Math.max(1, this.host.clientHeight);
    this.renderer.setSize(width, height, false);
    this.camera.aspect = width / height;
    this.camera.updateProjectionMatrix();
    this.requestRender();
  }
}
