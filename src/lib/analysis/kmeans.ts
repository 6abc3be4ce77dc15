/**
 * k-means in three dimensions (OKLab), started by k-means++ (Arthur & Vassilvitskii,
 * "k-means++: the advantages of careful seeding", SODA 2007) and refined by Lloyd's iterations.
 * Points and centres are flat Float64Arrays, three numbers per point.
 */

export interface ClusterFit {
  centres: Float64Array;
  /** Within-cluster sum of squared distances. */
  wcss: number;
}

export interface Assignment {
  labels: Uint8Array;
  counts: Float64Array;
  /** Mean of each cluster's points, three numbers per cluster. */
  means: Float64Array;
  /** Each cluster's mean squared distance from its mean. */
  meanSquares: Float64Array;
}

const squaredDistance = (points: Float64Array, i: number, centres: Float64Array, j: number) => {
  const dl = points[i] - centres[j];
  const da = points[i + 1] - centres[j + 1];
  const db = points[i + 2] - centres[j + 2];
  return dl * dl + da * da + db * db;
};

/**
 * Index of the centre nearest to point `i`; its squared distance is left in `lastDistance[0]` (a typed
 * array, so writing it allocates nothing: a number kept in a module variable is boxed on every write).
 */
const lastDistance = new Float64Array(1);
function nearest(points: Float64Array, i: number, centres: Float64Array): number {
  const l = points[i];
  const a = points[i + 1];
  const b = points[i + 2];
  const k = centres.length / 3;
  let cluster = 0;
  let distance = Infinity;
  for (let c = 0; c < k; c += 1) {
    const dl = l - centres[c * 3];
    const da = a - centres[c * 3 + 1];
    const db = b - centres[c * 3 + 2];
    const d = dl * dl + da * da + db * db;
    if (d < distance) {
      distance = d;
      cluster = c;
    }
  }
  lastDistance[0] = distance;
  return cluster;
}

/** k-means++ seeding: each next centre drawn with probability ∝ squared distance to the nearest chosen one. */
function seedCentres(points: Float64Array, k: number, random: () => number): Float64Array {
  const n = points.length / 3;
  const chosen: number[] = [Math.floor(random() * n)];
  const closest = new Float64Array(n).fill(Infinity);
  while (chosen.length < k) {
    const last = chosen[chosen.length - 1] * 3;
    let total = 0;
    for (let i = 0; i < n; i += 1) {
      const d = squaredDistance(points, i * 3, points, last);
      if (d < closest[i]) closest[i] = d;
      total += closest[i];
    }
    if (total === 0) break; // fewer distinct colours than k
    let target = random() * total;
    let pick = n - 1;
    for (let i = 0; i < n; i += 1) {
      target -= closest[i];
      if (target < 0) {
        pick = i;
        break;
      }
    }
    chosen.push(pick);
  }
  const centres = new Float64Array(chosen.length * 3);
  chosen.forEach((index, c) => centres.set(points.subarray(index * 3, index * 3 + 3), c * 3));
  return centres;
}

/** Assigns every point to its nearest centre and summarises each cluster. */
export function assignPoints(points: Float64Array, centres: Float64Array): Assignment {
  const n = points.length / 3;
  const k = centres.length / 3;
  const labels = new Uint8Array(n);
  const counts = new Float64Array(k);
  const sums = new Float64Array(k * 3);
  for (let i = 0; i < n; i += 1) {
    const cluster = nearest(points, i * 3, centres);
    labels[i] = cluster;
    counts[cluster] += 1;
    sums[cluster * 3] += points[i * 3];
    sums[cluster * 3 + 1] += points[i * 3 + 1];
    sums[cluster * 3 + 2] += points[i * 3 + 2];
  }
  const means = new Float64Array(k * 3);
  for (let c = 0; c < k; c += 1) {
    for (let axis = 0; axis < 3; axis += 1) {
      means[c * 3 + axis] = counts[c] ? sums[c * 3 + axis] / counts[c] : centres[c * 3 + axis];
    }
  }
  const meanSquares = new Float64Array(k);
  for (let i = 0; i < n; i += 1) meanSquares[labels[i]] += squaredDistance(points, i * 3, means, labels[i] * 3);
  for (let c = 0; c < k; c += 1) meanSquares[c] = counts[c] ? meanSquares[c] / counts[c] : 0;
  return { labels, counts, means, meanSquares };
}

/** Lloyd's iterations stop once no more than this fraction of points change cluster… */
const CONVERGED_FRACTION = 0.002;
/**
 * …or once no centre moves further than this in OKLab (a twentieth of the ~0.02 that is about one
 * just-noticeable difference; common practice for a stopping tolerance, not a published value).
 */
const CONVERGED_MOVE = 0.001;

function lloyd(points: Float64Array, initial: Float64Array, maxIterations: number): ClusterFit {
  const n = points.length / 3;
  const k = initial.length / 3;
  const centres = Float64Array.from(initial);
  const labels = new Int32Array(n).fill(-1);
  const sums = new Float64Array(k * 3);
  const counts = new Float64Array(k);
  for (let iteration = 0; iteration < maxIterations; iteration += 1) {
    let changed = 0;
    let wcss = 0;
    sums.fill(0);
    counts.fill(0);
    for (let i = 0; i < n; i += 1) {
      const cluster = nearest(points, i * 3, centres);
      wcss += lastDistance[0];
      if (labels[i] !== cluster) changed += 1;
      labels[i] = cluster;
      counts[cluster] += 1;
      sums[cluster * 3] += points[i * 3];
      sums[cluster * 3 + 1] += points[i * 3 + 1];
      sums[cluster * 3 + 2] += points[i * 3 + 2];
    }
    // Converged: the centres are those this pass measured against, so its distances are the fit's.
    if (changed <= n * CONVERGED_FRACTION) return { centres, wcss };
    let moved = 0;
    for (let c = 0; c < k; c += 1) {
      if (counts[c] === 0) continue; // an empty cluster keeps its centre
      let move = 0;
      for (let axis = 0; axis < 3; axis += 1) {
        const next = sums[c * 3 + axis] / counts[c];
        move += (next - centres[c * 3 + axis]) ** 2;
        centres[c * 3 + axis] = next;
      }
      if (move > moved) moved = move;
    }
    if (moved <= CONVERGED_MOVE ** 2) break;
  }
  let wcss = 0;
  for (let i = 0; i < n; i += 1) {
    nearest(points, i * 3, centres);
    wcss += lastDistance[0];
  }
  return { centres, wcss };
}

/** The best of `restarts` k-means++ runs (lowest WCSS); deterministic for a given `random`. */
export function fitKMeans(points: Float64Array, k: number, random: () => number, restarts = 2, maxIterations = 20): ClusterFit {
  let best: ClusterFit | undefined;
  for (let run = 0; run < restarts; run += 1) {
    const fit = lloyd(points, seedCentres(points, k, random), maxIterations);
    if (!best || fit.wcss < best.wcss) best = fit;
    if (k === 1) break;
  }
  return best!;
}
