// Latin hypercube sampling (McKay, Beckman & Conover 1979, "A comparison of three methods for
// selecting values of input variables in the analysis of output from a computer code",
// Technometrics 21, 239-245): each coordinate's range [0, 1) is cut into as many equal strata as
// there are episodes, each stratum is used by exactly one episode, and strata are matched across
// coordinates at random. Episode i of coordinate p takes stratum pi_p(i) of a keyed permutation
// (index-permutation.ts) and a uniform place inside it. The permutation is keyed by the master
// seed and the parameter's own sub-stream, and the place is drawn from the episode's design-point
// stream of that sub-stream, so adding or removing another parameter moves nothing here.
import { RandomStream, StreamPurpose } from '../random/random-stream.ts';
import { IndexPermutation } from './index-permutation.ts';

export class LatinHypercubeCoordinate {
  private readonly permutation: IndexPermutation;

  /** `subStream` identifies the coordinate (e.g. the FNV-1a fold of its parameter's pointer). */
  constructor(
    private readonly seed: number | string,
    readonly points: number,
    readonly subStream: number,
  ) {
    this.permutation = new IndexPermutation(points, new RandomStream(seed, 0, StreamPurpose.designSetup, subStream));
  }

  /** Stratum (0 to points - 1) of episode `index`. */
  stratum(index: number): number {
    return this.permutation.map(index);
  }

  /** Coordinate in [0, 1) of episode `index`; floor(coordinate × points) is its stratum. */
  coordinate(index: number): number {
    const stratum = this.stratum(index);
    const place = new RandomStream(this.seed, index, StreamPurpose.designPoint, this.subStream).nextFloat64();
    let u = (stratum + place) / this.points;
    // Division may round onto the next stratum's lower edge (or this one's from below); step
    // back inside so that the stratification holds exactly in floating point too.
    while (u * this.points >= stratum + 1 || u >= 1) u = nextDown(u);
    while (Math.floor(u * this.points) < stratum) u = nextUp(u);
    return u;
  }
}

const bits = new Float64Array(1);
const words = new BigUint64Array(bits.buffer);

function nextUp(x: number): number {
  bits[0] = x;
  words[0] += 1n;
  return bits[0];
}

function nextDown(x: number): number {
  bits[0] = x;
  words[0] -= 1n;
  return bits[0];
}
