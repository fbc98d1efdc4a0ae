/**
 * Product basis of several transmons and the coupled Hamiltonian in it
 * (README physics conventions sec. 2, extended to any number of capacitively coupled transmons):
 *
 *     H = sum_i H_i + sum_(i,j) G_ij n_i n_j,
 *
 * each H_i diagonal in its own eigenbasis (energies E^i_m, m < K_i) and n_i its charge matrix in
 * that basis. Product states |m_0 m_1 ...> are indexed row-major with the first transmon most
 * significant, so for a pair |ij> = |i>_A |j>_B has index i K_B + j (order |AB>).
 *
 * Parity sectors: at n_g = 0 the eigenstates of a transmon alternate in charge parity, so <m|n|m'>
 * vanishes unless m + m' is odd, and each coupling term changes sum_i m_i by an even number.
 * The total excitation parity (sum_i m_i mod 2) is therefore conserved, and H (and any operator
 * acting on one transmon through an even function of its phase, such as cos phi) is block
 * diagonal in the two sectors.
 */

export interface ProductSpace {
  /** Levels kept per transmon (K_i). */
  dims: readonly number[];
  /** prod K_i */
  size: number;
  /** strides[i] = prod_{j > i} K_j */
  strides: readonly number[];
}

export function productSpace(dims: readonly number[]): ProductSpace {
  if (dims.length === 0 || dims.some((k) => !Number.isInteger(k) || k < 1)) throw new RangeError(`productSpace: bad dims ${dims.join(',')}`);
  const strides = new Array<number>(dims.length);
  let s = 1;
  for (let i = dims.length - 1; i >= 0; i--) {
    strides[i] = s;
    s *= dims[i];
  }
  return { dims: [...dims], size: s, strides };
}

/** Index of the product state with levels `levels` (one per transmon). */
export function productIndex(space: ProductSpace, levels: readonly number[]): number {
  let idx = 0;
  for (let i = 0; i < space.dims.length; i++) {
    const m = levels[i];
    if (!(m >= 0 && m < space.dims[i])) throw new RangeError(`productIndex: level ${m} outside 0..${space.dims[i] - 1}`);
    idx += m * space.strides[i];
  }
  return idx;
}

/** Levels of the product state at `index`. */
export function productLevels(space: ProductSpace, index: number): number[] {
  const out = new Array<number>(space.dims.length);
  for (let i = 0; i < space.dims.length; i++) out[i] = Math.floor(index / space.strides[i]) % space.dims[i];
  return out;
}

/** Label such as "11" or "2,10" (comma-separated once any level exceeds 9). */
export function productLabel(space: ProductSpace, index: number): string {
  const levels = productLevels(space, index);
  return levels.some((m) => m > 9) ? levels.join(',') : levels.join('');
}

export interface TransmonPart {
  /** E_m, m < K (GHz). */
  energies: ArrayLike<number>;
  /** K x K charge matrix <m|n|m'>. */
  charge: ArrayLike<number>;
}

export interface ChargeCoupling {
  /** Transmon indices. */
  a: number;
  b: number;
  /** Charge-charge coupling G (GHz). */
  gCharge: number;
}

/**
 * Dense real symmetric H (size x size, row-major) in the product basis.
 * Cost O(size^2 * couplings).
 */
export function productHamiltonian(space: ProductSpace, parts: readonly TransmonPart[], couplings: readonly ChargeCoupling[], out?: Float64Array): Float64Array {
  const n = space.size;
  const h = out ?? new Float64Array(n * n);
  h.fill(0);
  const t = space.dims.length;
  if (parts.length !== t) throw new RangeError(`productHamiltonian: ${parts.length} parts for ${t} transmons`);
  const levels = new Int32Array(t);
  for (let idx = 0; idx < n; idx++) {
    let rem = idx;
    let e = 0;
    for (let i = 0; i < t; i++) {
      levels[i] = Math.floor(rem / space.strides[i]);
      rem -= levels[i] * space.strides[i];
      e += parts[i].energies[levels[i]];
    }
    h[idx * n + idx] = e;
  }
  for (const c of couplings) {
    const { a, b, gCharge } = c;
    const ka = space.dims[a];
    const kb = space.dims[b];
    const sa = space.strides[a];
    const sb = space.strides[b];
    const na = parts[a].charge;
    const nb = parts[b].charge;
    for (let idx = 0; idx < n; idx++) {
      const ma = Math.floor(idx / sa) % ka;
      const mb = Math.floor(idx / sb) % kb;
      const base = idx - ma * sa - mb * sb;
      for (let pa = 0; pa < ka; pa++) {
        const x = na[ma * ka + pa];
        if (x === 0) continue;
        for (let pb = 0; pb < kb; pb++) {
          const y = nb[mb * kb + pb];
          if (y === 0) continue;
          h[idx * n + base + pa * sa + pb * sb] += gCharge * x * y;
        }
      }
    }
  }
  return h;
}

/** Indices of the product states with even and with odd total excitation number. */
export function paritySectors(space: ProductSpace): { even: Int32Array; odd: Int32Array } {
  const even: number[] = [];
  const odd: number[] = [];
  for (let idx = 0; idx < space.size; idx++) {
    const s = productLevels(space, idx).reduce((x, y) => x + y, 0);
    (s % 2 === 0 ? even : odd).push(idx);
  }
  return { even: Int32Array.from(even), odd: Int32Array.from(odd) };
}

/** The sub-matrix m[indices, indices] of an n x n row-major matrix. */
export function subMatrix(m: ArrayLike<number>, n: number, indices: ArrayLike<number>, out?: Float64Array): Float64Array {
  const k = indices.length;
  const r = out ?? new Float64Array(k * k);
  for (let i = 0; i < k; i++) {
    const row = indices[i] * n;
    for (let j = 0; j < k; j++) r[i * k + j] = m[row + indices[j]];
  }
  return r;
}
