/*
 * The chain-1024 benchmark case written in plain C, as the yardstick for the TypeScript kernel
 * (sim/core/simulator.ts, body-forces.ts, spring-forces.ts). It keeps the same data layout
 * (interleaved xyz doubles per node, uint32 spring end indices, one double per spring for rest
 * length, stiffness and damping) and the same floating-point operations in the same order, so
 * the two builds reach the same checksum bit for bit when the compiler is told not to fuse
 * multiply-adds (-ffp-contract=off): the comparison is then between code generators, not
 * between two different computations.
 *
 * Usage: chain_kernel [steps] [bending]   (default 10000 steps, no bending)
 * "bending" adds the chain-1024-bending case's hinges and clamp (sim/bench/chain-1024-bending.ts,
 * passes as sim/core/bending-forces.ts, after the springs).
 * Prints one JSON object: spring_updates_per_s, seconds (wall), cpu_seconds (this process's CPU
 * time, steadier on a shared machine), checksum (17 significant digits).
 */
#define _POSIX_C_SOURCE 199309L
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
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
  int hinge_count;
  uint32_t *hinge_nodes;
  double *hinge_stiffness_nm;
  double *hinge_damping_nms;
  int clamp_count;
  uint32_t *clamp_nodes;
  double *clamp_direction_unit;
  double *clamp_stiffness_nm;
  double *clamp_damping_nms;
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

/* Same definition as sim/bench/chain-1024-bending.ts: a hinge at every interior node, a clamp
 * holding segment (0, 1) along +x. */
enum { BENDING_OFF = 0, BENDING_ON = 1 };
static const double HINGE_STIFFNESS_NM = 0.05;
static const double HINGE_DAMPING_NMS = 1e-5;
static const double CLAMP_STIFFNESS_NM = 0.1;
static const double CLAMP_DAMPING_NMS = 2e-5;
static const double STRAIGHT_HINGE_W2 = 1e-28;

static void add_bending(model_t *m) {
  const int n = m->node_count;
  m->hinge_count = n - 2;
  m->hinge_nodes = checked_calloc(3 * (size_t)m->hinge_count, sizeof(uint32_t));
  m->hinge_stiffness_nm = checked_calloc((size_t)m->hinge_count, sizeof(double));
  m->hinge_damping_nms = checked_calloc((size_t)m->hinge_count, sizeof(double));
  for (int h = 0; h < m->hinge_count; h++) {
    m->hinge_nodes[3 * h] = (uint32_t)h;
    m->hinge_nodes[3 * h + 1] = (uint32_t)(h + 1);
    m->hinge_nodes[3 * h + 2] = (uint32_t)(h + 2);
    m->hinge_stiffness_nm[h] = HINGE_STIFFNESS_NM;
    m->hinge_damping_nms[h] = HINGE_DAMPING_NMS;
  }
  m->clamp_count = 1;
  m->clamp_nodes = checked_calloc(2, sizeof(uint32_t));
  m->clamp_direction_unit = checked_calloc(3, sizeof(double));
  m->clamp_stiffness_nm = checked_calloc(1, sizeof(double));
  m->clamp_damping_nms = checked_calloc(1, sizeof(double));
  m->clamp_nodes[0] = 0;
  m->clamp_nodes[1] = 1;
  m->clamp_direction_unit[0] = 1.0;
  m->clamp_stiffness_nm[0] = CLAMP_STIFFNESS_NM;
  m->clamp_damping_nms[0] = CLAMP_DAMPING_NMS;
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

static void accumulate_bending_forces(const model_t *m, double *restrict force_n) {
  const double *restrict x = m->position_m;
  const double *restrict v = m->velocity_m_per_s;
  const uint32_t *restrict nodes = m->hinge_nodes;
  for (int h = 0; h < m->hinge_count; h++) {
    const uint32_t ip = 3 * nodes[3 * h];
    const uint32_t im = 3 * nodes[3 * h + 1];
    const uint32_t in = 3 * nodes[3 * h + 2];
    const double eax = x[im] - x[ip];
    const double eay = x[im + 1] - x[ip + 1];
    const double eaz = x[im + 2] - x[ip + 2];
    const double ebx = x[in] - x[im];
    const double eby = x[in + 1] - x[im + 1];
    const double ebz = x[in + 2] - x[im + 2];
    const double la = sqrt(eax * eax + eay * eay + eaz * eaz);
    const double lb = sqrt(ebx * ebx + eby * eby + ebz * ebz);
    if (la == 0.0 || lb == 0.0) continue;
    const double ila = 1.0 / la;
    const double ilb = 1.0 / lb;
    const double tax = eax * ila, tay = eay * ila, taz = eaz * ila;
    const double tbx = ebx * ilb, tby = eby * ilb, tbz = ebz * ilb;
    const double cos_phi = tax * tbx + tay * tby + taz * tbz;
    const double uax = (tbx - cos_phi * tax) * ila;
    const double uay = (tby - cos_phi * tay) * ila;
    const double uaz = (tbz - cos_phi * taz) * ila;
    const double ubx = (tax - cos_phi * tbx) * ilb;
    const double uby = (tay - cos_phi * tby) * ilb;
    const double ubz = (taz - cos_phi * tbz) * ilb;
    double s = m->hinge_stiffness_nm[h];
    const double damping = m->hinge_damping_nms[h];
    if (damping > 0.0) {
      const double wx = tbx - tax, wy = tby - tay, wz = tbz - taz;
      const double w2 = wx * wx + wy * wy + wz * wz;
      if (w2 > STRAIGHT_HINGE_W2) {
        const double w_dot =
          -(uax * (v[im] - v[ip]) + uay * (v[im + 1] - v[ip + 1]) + uaz * (v[im + 2] - v[ip + 2]) +
            (ubx * (v[in] - v[im]) + uby * (v[in + 1] - v[im + 1]) + ubz * (v[in + 2] - v[im + 2])));
        s += (damping * w_dot) / w2;
      }
    }
    force_n[ip] -= s * uax;
    force_n[ip + 1] -= s * uay;
    force_n[ip + 2] -= s * uaz;
    force_n[im] += s * (uax - ubx);
    force_n[im + 1] += s * (uay - uby);
    force_n[im + 2] += s * (uaz - ubz);
    force_n[in] += s * ubx;
    force_n[in + 1] += s * uby;
    force_n[in + 2] += s * ubz;
  }
}

static void accumulate_clamp_forces(const model_t *m, double *restrict force_n) {
  const double *restrict x = m->position_m;
  const double *restrict v = m->velocity_m_per_s;
  for (int q = 0; q < m->clamp_count; q++) {
    const uint32_t ia = 3 * m->clamp_nodes[2 * q];
    const uint32_t ib = 3 * m->clamp_nodes[2 * q + 1];
    const double ex = x[ib] - x[ia];
    const double ey = x[ib + 1] - x[ia + 1];
    const double ez = x[ib + 2] - x[ia + 2];
    const double length = sqrt(ex * ex + ey * ey + ez * ez);
    if (length == 0.0) continue;
    const double il = 1.0 / length;
    const double tx = ex * il, ty = ey * il, tz = ez * il;
    const double dx = m->clamp_direction_unit[3 * q];
    const double dy = m->clamp_direction_unit[3 * q + 1];
    const double dz = m->clamp_direction_unit[3 * q + 2];
    const double cos_phi = tx * dx + ty * dy + tz * dz;
    const double ux = (dx - cos_phi * tx) * il;
    const double uy = (dy - cos_phi * ty) * il;
    const double uz = (dz - cos_phi * tz) * il;
    double s = m->clamp_stiffness_nm[q];
    const double damping = m->clamp_damping_nms[q];
    if (damping > 0.0) {
      const double wx = tx - dx, wy = ty - dy, wz = tz - dz;
      const double w2 = wx * wx + wy * wy + wz * wz;
      if (w2 > STRAIGHT_HINGE_W2) {
        const double w_dot = -(ux * (v[ib] - v[ia]) + uy * (v[ib + 1] - v[ia + 1]) + uz * (v[ib + 2] - v[ia + 2]));
        s += (damping * w_dot) / w2;
      }
    }
    force_n[ia] -= s * ux;
    force_n[ia + 1] -= s * uy;
    force_n[ia + 2] -= s * uz;
    force_n[ib] += s * ux;
    force_n[ib + 1] += s * uy;
    force_n[ib + 2] += s * uz;
  }
}

/* No ground plane in this case, so velocities and positions are updated in one pass, as
 * Simulator.step does when ground contact is off. */
static void step(model_t *m, const world_t *w, double *restrict force_n, double dt_s) {
  write_body_forces(m, w, force_n);
  accumulate_spring_forces(m, force_n);
  if (m->hinge_count > 0) accumulate_bending_forces(m, force_n);
  if (m->clamp_count > 0) accumulate_clamp_forces(m, force_n);
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
  int bending = BENDING_OFF;
  if (argc > 2) {
    if (strcmp(argv[2], "bending") == 0) {
      bending = BENDING_ON;
    } else {
      fprintf(stderr, "chain_kernel: the second argument must be \"bending\" or absent, got \"%s\"\n", argv[2]);
      return 2;
    }
  }
  model_t model = { 0 };
  build_chain_1024(&model);
  if (bending == BENDING_ON) add_bending(&model);
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
