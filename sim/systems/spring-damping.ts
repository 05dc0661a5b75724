// Axial damping of a spring from a damping ratio ζ: the spring and its two end masses form a
// two-body oscillator with reduced mass μ = m_a·m_b/(m_a + m_b), whose critical damping is
// 2√(k·μ); so c = 2ζ√(k·μ) (definition of the damping ratio, e.g. Rao, Mechanical Vibrations).

export function dampingFromRatio(dampingRatio: number, stiffnessNPerM: number, massAKg: number, massBKg: number): number {
  const reducedMassKg = (massAKg * massBKg) / (massAKg + massBKg);
  return 2 * dampingRatio * Math.sqrt(stiffnessNPerM * reducedMassKg);
}
