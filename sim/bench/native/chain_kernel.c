/*
 * The chain-1024 benchmark case written in plain C, as the yardstick for the TypeScript kernel
 * (sim/core/simulator.ts, body-forces.ts, spring-forces.ts). It keeps the same data layout
 * (interleaved xyz doubles per node, uint32 spring end indices, one double per spring for rest
 * length, stiffness and damping) and the same floating-point operations in the same order, so
 * the two builds reach the same checksum bit for bit when the compiler is told not to fuse
 * multiply-adds (-ffp-contract=off): the comparison is then between code generators, not
 * between two different computations.
 *
 * Usage: chain_kernel [steps]   (default 10000)
 * Prints one JSON object: spring_updates_per_s, seconds (wall), cpu_seconds (this process's CPU
 * time, steadier on a shared machine), checksum (17 significant digits).
 */
#define _POSIX_C_SOURCE 199309L
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <time.h>

enum { NODE_COUNT = 1024 };

typedef struct {
  int node_count;
  int spring_count;
  double *position_m;
  double *velocity_m_per_s;
  double *mass_kg;
  double *inverse_mass_per_kg;
  double *node_volume_m3;
  uint32_t *spring_node_a;
  uint32_t *spring_node_b;
  double *rest_length_m;
  double *stiffness_n_per_m;
  double *damping_ns_per_m;
} model_t;

typedef struct {
  double gravity_m_per_s2[3];
  double air_drag_per_s;
  double buoyant_density_kg_per_m3;
} world_t;

static void *checked_calloc(size_t count, size_t size) {
  void *p = calloc(count, size);
  if (!p) {
    fprintf(stderr, "chain_kernel: out of memory\n");
    exit(1);
  }
  return p;
}

/* Same definition as sim/bench/chain-1024.ts: structural springs first, then bending. */
static void build_chain_1024(model_t *m) {
  const int n = NODE_COUNT;
  const int springs = (n - 1) + (n - 2);
  m->node_count = n;
  m->spring_count = springs;
  m->position_m = checked_calloc(3 * (size_t)n, sizeof(double));
  m->velocity_m_per_s = checked_calloc(3 * (size_t)n, sizeof(double));
  m->mass_kg = checked_calloc((size_t)n, sizeof(double));
  m->inverse_mass_per_kg = checked_calloc((size_t)n, sizeof(double));
  m->node_volume_m3 = checked_calloc((size_t)n, sizeof(double));
  m->spring_node_a = checked_calloc((size_t)springs, sizeof(uint32_t));
  m->spring_node_b = checked_calloc((size_t)springs, sizeof(uint32_t));
  m->rest_length_m = checked_calloc((size_t)springs, sizeof(double));
  m->stiffness_n_per_m = checked_calloc((size_t)springs, sizeof(double));
  m->damping_ns_per_m = checked_calloc((size_t)springs, sizeof(double));
  for (int i = 0; i < n; i++) {
    m->position_m[3 * i] = 0.01 * (double)i;
    m->mass_kg[i] = 0.01;
    m->inverse_mass_per_kg[i] = i == 0 ? 0.0 : 1.0 / m->mass_kg[i];
  }
  int s = 0;
  for (int i = 0; i + 1 < n; i++, s++) {
    m->spring_node_a[s] = (uint32_t)i;
    m->spring_node_b[s] = (uint32_t)(i + 1);
    m->stiffness_n_per_m[s] = 200.0;
    m->damping_ns_per_m[s] = 0.05;
    m->rest_length_m[s] = 0.01;
  }
  for (int i = 0; i + 2 < n; i++, s++) {
    m->spring_node_a[s] = (uint32_t)i;
    m->spring_node_b[s] = (uint32_t)(i + 2);
    m->stiffness_n_per_m[s] = 20.0;
    m->damping_ns_per_m[s] = 0.005;
    m->rest_length_m[s] = 0.02;
  }
}

static void write_body_forces(const model_t *m, const world_t *w, double *restrict force_n) {
  const double gx = w->gravity_m_per_s2[0];
  const double gy = w->gravity_m_per_s2[1];
  const double gz = w->gravity_m_per_s2[2];
  const double drag = w->air_drag_per_s;
  const double buoyant = w->buoyant_density_kg_per_m3;
  const double *restrict mass = m->mass_kg;
  const double *restrict inv = m->inverse_mass_per_kg;
  const double *restrict vol = m->node_volume_m3;
  const double *restrict v = m->velocity_m_per_s;
  for (int i = 0; i < m->node_count; i++) {
    const int o = 3 * i;
    if (inv[i] == 0.0) {
      force_n[o] = 0.0;
      force_n[o + 1] = 0.0;
      force_n[o + 2] = 0.0;
      continue;
    }
    const double weight_mass = mass[i] - buoyant * vol[i];
    const double drag_mass = mass[i] * drag;
    force_n[o] = weight_mass * gx - drag_mass * v[o];
    force_n[o + 1] = weight_mass * gy - drag_mass * v[o + 1];
    force_n[o + 2] = weight_mass * gz - drag_mass * v[o + 2];
  }
}

static void accumulate_spring_forces(const model_t *m, double *restrict force_n) {
  const double *restrict x = m->position_m;
  const double *restrict v = m->velocity_m_per_s;
  const uint32_t *restrict a = m->spring_node_a;
  const uint32_t *restrict b = m->spring_node_b;
  const double *restrict rest = m->rest_length_m;
  const double *restrict k = m->stiffness_n_per_m;
  const double *restrict c = m->damping_ns_per_m;
  for (int s = 0; s < m->spring_count; s++) {
    const uint32_t ia = 3 * a[s];
    const uint32_t ib = 3 * b[s];
    const double dx = x[ib] - x[ia];
    const double dy = x[ib + 1] - x[ia + 1];
    const double dz = x[ib + 2] - x[ia + 2];
    const double length = sqrt(dx * dx + dy * dy + dz * dz);
    if (length == 0.0) continue;
    const double inv = 1.0 / length;
    const double nx = dx * inv;
    const double ny = dy * inv;
    const double nz = dz * inv;
    const double dvn = (v[ib] - v[ia]) * nx + (v[ib + 1] - v[ia + 1]) * ny + (v[ib + 2] - v[ia + 2]) * nz;
    const double f = k[s] * (length - rest[s]) + c[s] * dvn;
    const double fx = f * nx;
    const double fy = f * ny;
    const double fz = f * nz;
    force_n[ia] += fx;
    force_n[ia + 1] += fy;
    force_n[ia + 2] += fz;
    force_n[ib] -= fx;
    force_n[ib + 1] -= fy;
    force_n[ib + 2] -= fz;
  }
}

/* No ground plane in this case, so velocities and positions are updated in one pass, as
 * Simulator.step does when ground contact is off. */
static void step(model_t *m, const world_t *w, double *restrict force_n, double dt_s) {
  write_body_forces(m, w, force_n);
  accumulate_spring_forces(m, force_n);
  double *restrict x = m->position_m;
  double *restrict v = m->velocity_m_per_s;
  const double *restrict inv = m->inverse_mass_per_kg;
  const int n = m->node_count;
  for (int i = 0; i < n; i++) {
    const double im = inv[i];
    const double wt = im * dt_s;
    const int o = 3 * i;
    const double vx = v[o] + wt * force_n[o];
    const double vy = v[o + 1] + wt * force_n[o + 1];
    const double vz = v[o + 2] + wt * force_n[o + 2];
    v[o] = vx;
    v[o + 1] = vy;
    v[o + 2] = vz;
    if (im == 0.0) continue;
    x[o] += dt_s * vx;
    x[o + 1] += dt_s * vy;
    x[o + 2] += dt_s * vz;
  }
}

int main(int argc, char **argv) {
  long steps = 10000;
  if (argc > 1) {
    char *end = NULL;
    steps = strtol(argv[1], &end, 10);
    if (!end || *end != '\0' || steps < 1) {
      fprintf(stderr, "chain_kernel: steps must be a positive integer, got \"%s\"\n", argv[1]);
      return 2;
    }
  }
  model_t model;
  build_chain_1024(&model);
  const world_t world = { { 0.0, -9.81, 0.0 }, 0.0, 0.0 };
  double *force_n = checked_calloc(3 * (size_t)model.node_count, sizeof(double));
  const double dt_s = 1e-4;

  struct timespec t0, t1, c0, c1;
  clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &c0);
  clock_gettime(CLOCK_MONOTONIC, &t0);
  for (long s = 0; s < steps; s++) step(&model, &world, force_n, dt_s);
  clock_gettime(CLOCK_MONOTONIC, &t1);
  clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &c1);
  const double seconds = (double)(t1.tv_sec - t0.tv_sec) + 1e-9 * (double)(t1.tv_nsec - t0.tv_nsec);
  const double cpu_seconds = (double)(c1.tv_sec - c0.tv_sec) + 1e-9 * (double)(c1.tv_nsec - c0.tv_nsec);

  double checksum = 0.0;
  for (int i = 0; i < 3 * model.node_count; i++) checksum += model.position_m[i];
  const double updates = (double)model.spring_count * (double)steps;
  printf("{\"spring_updates_per_s\":%.0f,\"seconds\":%.6f,\"cpu_seconds\":%.6f,\"checksum\":%.17g}\n", updates / seconds, seconds, cpu_seconds, checksum);
  return 0;
}
