// Valid prediction time: how long a rollout stays within a threshold ε of the truth in the
// normalised error e(h) = RMSE(h)/ℓ. It is the longest time t_f such that e(h) ≤ ε for every
// step up to t_f, i.e. the time of the last step before the first step with e > ε. Definition
// after Vlachas et al., Neural Networks 126 (2020) 191–217 (from memory; they normalise each
// coordinate by its standard deviation, we by the episode's length scale). When the error never
// passes ε the rollout's whole duration is returned with reached = false (a censored value).

export interface ValidPredictionTime {
  seconds: number;
  /** True when e passed ε within the rollout. */
  reached: boolean;
}

export function validPredictionTime(normalisedError: Float64Array, timeS: ArrayLike<number>, rows: number, threshold: number): ValidPredictionTime {
  for (let h = 1; h < rows; h++) {
    if (normalisedError[h] > threshold) return { seconds: timeS[h - 1] - timeS[0], reached: true };
  }
  return { seconds: timeS[rows - 1] - timeS[0], reached: false };
}
