/*
 * The lattice-8x8x8 benchmark case written in plain C, the yardstick for the lattice runs of the
 * JavaScript and WebAssembly kernels. Building the lattice (materials, spring shares, damping)
 * stays in TypeScript: sim/bench/native-lattice-kernel.ts writes the built model, the world and
 * the control of every interval into one binary file, and this program runs the same step on it
 * with the same floating-point operations in the same order as sim/core (body-forces.ts,
 * spring-forces.ts, ground-contact.ts, control-application.ts applyActuation, simulator.ts), so
 * with -ffp-contract=off it ends on the same checksum bit for bit.
 *
 * Usage: lattice_kernel MODEL_FILE
 * MODEL_FILE, little-endian: "PLK1"; int32 node_count, spring_count, actuation_count,
 * channel_count, intervals, substeps, ground_enabled; float64 interval_s, gravity x y z,
 * air_drag_per_s, buoyant_density, ground_height_m, static_friction, kinetic_friction; then
 * float64 position[3n], velocity[3n], mass[n], inverse_mass[n], volume[n]; uint32 spring_a[s],
 * spring_b[s]; float64 base_rest[s], stiffness[s], damping[s]; uint32 act_spring[e],
 * act_channel[e]; float64 act_gain[e]; float64 controls[intervals × channel_count].
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

typedef struct {
  int32_t node_count, spring_count, actuation_count, channel_count, intervals, substeps, ground_enabled;
  double interval_s, gx, gy, gz, air_drag_per_s, buoyant_density, ground_height_m, static_friction, kinetic_friction;
  double *position_m, *velocity_m_per_s, *mass_kg, *inverse_mass_per_kg, *node_volume_m3;
  uint32_t *spring_node_a, *spring_node_b;
  double *base_rest_length_m, *rest_length_m, *stiffness_n_per_m, *damping_ns_per_m;
  uint32_t *actuation_spring, *actuation_channel;
  double *actuation_gain, *controls;
} lattice_t;

static FILE *input;

static void read_exact(void *out, size_t size, size_t count) {
  if (count == 0) return;
  if (fread(out, size, count, input) != count) {
    fprintf(stderr, "lattice_kernel: the model file ends early\n");
    exit(1);
  }
}

static void *read_array(size_t size, size_t count) {
  void *p = calloc(count > 0 ? count : 1, size);
  if (!p) {
    fprintf(stderr, "lattice_kernel: out of memory\n");
    exit(1);
  }
  read_exact(p, size, count);
  return p;
}

static void read_lattice(const char *path, lattice_t *m) {
  input = fopen(path, "rb");
  if (!input) {
    fprintf(stderr, "lattice_kernel: cannot open %s\n", path);
    exit(1);
  }
  char magic[4];
  read_exact(magic, 1, 4);
  if (memcmp(magic, "PLK1", 4) != 0) {
    fprintf(stderr, "lattice_kernel: %s is not a lattice model file\n", path);
    exit(1);
  }
  read_exact(&m->node_count, 4, 7);
  read_exact(&m->interval_s, 8, 9);
  const size_t n = (size_t)m->node_count, s = (size_t)m->spring_count, e = (size_t)m->actuation_count;
  m->position_m = read_array(8, 3 * n);
  m->velocity_m_per_s = read_array(8, 3 * n);
  m->mass_kg = read_array(8, n);
  m->inverse_mass_per_kg = read_array(8, n);
  m->node_volume_m3 = read_array(8, n);
  m->spring_node_a = read_array(4, s);
  m->spring_node_b = read_array(4, s);
  m->base_rest_length_m = read_array(8, s);
  m->stiffness_n_per_m = read_array(8, s);
  m->damping_ns_per_m = read_array(8, s);
  m->actuation_spring = read_array(4, e);
  m->actuation_channel = read_array(4, e);
  m->actuation_gain = read_array(8, e);
  m->controls = read_array(8, (size_t)m->intervals * (size_t)m->channel_count);
  m->rest_length_m = calloc(s > 0 ? s : 1, 8);
  memcpy(m->rest_length_m, m->base_rest_length_m, 8 * s);
  fclose(input);
}

static void apply_actuation(lattice_t *m, const double *controls) {
  memcpy(m->rest_length_m, m->base_rest_length_m, 8 * (size_t)m->spring_count);
  for (int e = 0; e < m->actuation_count; e++) {
    const uint32_t s = m->actuation_spring[e];
    m->rest_length_m[s] += m->base_rest_length_m[s] * m->actuation_gain[e] * controls[m->actuation_channel[e]];
  }
}

static void write_body_forces(const lattice_t *m, double *restrict force_n) {
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
    const double weight_mass = mass[i] - m->buoyant_density * vol[i];
    const double drag_mass = mass[i] * m->air_drag_per_s;
    force_n[o] = weight_mass * m->gx - drag_mass * v[o];
    force_n[o + 1] = weight_mass * m->gy - drag_mass * v[o + 1];
    force_n[o + 2] = weight_mass * m->gz - drag_mass * v[o + 2];
  }
}

static void accumulate_spring_forces(const lattice_t *m, double *restrict force_n) {
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

static void update_velocities(lattice_t *m, const double *restrict force_n, double dt_s) {
  double *restrict v = m->velocity_m_per_s;
  for (int i = 0; i < m->node_count; i++) {
    const double w = m->inverse_mass_per_kg[i] * dt_s;
    const int o = 3 * i;
    v[o] += w * force_n[o];
    v[o + 1] += w * force_n[o + 1];
    v[o + 2] += w * force_n[o + 2];
  }
}

static void project_ground_contact(lattice_t *m, double dt_s) {
  double *restrict x = m->position_m;
  double *restrict v = m->velocity_m_per_s;
  const double h = m->ground_height_m;
  for (int i = 0; i < m->node_count; i++) {
    if (m->inverse_mass_per_kg[i] == 0.0) continue;
    const int o = 3 * i;
    const double y = x[o + 1];
    const double vy = v[o + 1];
    if (y + dt_s * vy >= h) continue;
    const double landing = y < h ? 0.0 : (h - y) / dt_s;
    const double dvn = landing - vy;
    v[o + 1] = landing;
    const double vx = v[o];
    const double vz = v[o + 2];
    const double speed = sqrt(vx * vx + vz * vz);
    if (speed <= m->static_friction * dvn) {
      v[o] = 0.0;
      v[o + 2] = 0.0;
    } else {
      const double r = 1.0 - (m->kinetic_friction * dvn) / speed;
      const double scale = r > 0.0 ? r : 0.0; /* Math.max(0, r) for every non-NaN r */
      v[o] = vx * scale;
      v[o + 2] = vz * scale;
    }
    if (y < h) x[o + 1] = h;
  }
}

static void update_positions(lattice_t *m, double dt_s) {
  double *restrict x = m->position_m;
  const double *restrict v = m->velocity_m_per_s;
  for (int i = 0; i < m->node_count; i++) {
    if (m->inverse_mass_per_kg[i] == 0.0) continue;
    const int o = 3 * i;
    x[o] += dt_s * v[o];
    x[o + 1] += dt_s * v[o + 1];
    x[o + 2] += dt_s * v[o + 2];
  }
}

static void update_velocities_and_positions(lattice_t *m, const double *restrict force_n, double dt_s) {
  double *restrict x = m->position_m;
  double *restrict v = m->velocity_m_per_s;
  for (int i = 0; i < m->node_count; i++) {
    const double im = m->inverse_mass_per_kg[i];
    const double w = im * dt_s;
    const int o = 3 * i;
    const double vx = v[o] + w * force_n[o];
    const double vy = v[o + 1] + w * force_n[o + 1];
    const double vz = v[o + 2] + w * force_n[o + 2];
    v[o] = vx;
    v[o + 1] = vy;
    v[o + 2] = vz;
    if (im == 0.0) continue;
    x[o] += dt_s * vx;
    x[o + 1] += dt_s * vy;
    x[o + 2] += dt_s * vz;
  }
}

static void step(lattice_t *m, double *restrict force_n, double dt_s) {
  write_body_forces(m, force_n);
  accumulate_spring_forces(m, force_n);
  if (m->ground_enabled) {
    update_velocities(m, force_n, dt_s);
    project_ground_contact(m, dt_s);
    update_positions(m, dt_s);
  } else {
    update_velocities_and_positions(m, force_n, dt_s);
  }
}

int main(int argc, char **argv) {
  if (argc != 2) {
    fprintf(stderr, "usage: lattice_kernel MODEL_FILE\n");
    return 2;
  }
  lattice_t m;
  read_lattice(argv[1], &m);
  double *force_n = calloc(3 * (size_t)m.node_count, sizeof(double));
  const double dt_s = m.interval_s / (double)m.substeps;

  struct timespec t0, t1, c0, c1;
  clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &c0);
  clock_gettime(CLOCK_MONOTONIC, &t0);
  for (int t = 0; t < m.intervals; t++) {
    if (m.actuation_count > 0) apply_actuation(&m, m.controls + (size_t)t * (size_t)m.channel_count);
    for (int s = 0; s < m.substeps; s++) step(&m, force_n, dt_s);
  }
  clock_gettime(CLOCK_MONOTONIC, &t1);
  clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &c1);
  const double seconds = (double)(t1.tv_sec - t0.tv_sec) + 1e-9 * (double)(t1.tv_nsec - t0.tv_nsec);
  const double cpu_seconds = (double)(c1.tv_sec - c0.tv_sec) + 1e-9 * (double)(c1.tv_nsec - c0.tv_nsec);

  double checksum = 0.0;
  for (int i = 0; i < 3 * m.node_count; i++) checksum += m.position_m[i];
  const double updates = (double)m.spring_count * (double)m.substeps * (double)m.intervals;
  printf("{\"spring_updates_per_s\":%.0f,\"seconds\":%.6f,\"cpu_seconds\":%.6f,\"checksum\":%.17g}\n", updates / seconds, seconds, cpu_seconds, checksum);
  return 0;
}
