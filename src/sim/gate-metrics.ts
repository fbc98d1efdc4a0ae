/**
 * Gate metrics of a two-qubit block M (README physics conventions sec. 3): M is the 4 x 4 block of the
 * propagator on the dressed computational states |00>, |01>, |10>, |11> (order |AB>, row-major,
 * M[r*4 + c] = <r|U|c>) in the lab frame (each qubit rotating at its dressed idle frequency).
 *
 *   conditional phase  phi_c = arg M_11 - arg M_10 - arg M_01 + arg M_00, wrapped to (-pi, pi]
 *   leakage            L = 1 - Tr(M^dag M) / 4                         (Wood and Gambetta, PRA 97, 032306 (2018))
 *   fidelity           F = [Tr(M M^dag) + |Tr(V^dag M)|^2] / 20         (Pedersen, Moller, Molmer, PLA 367, 47 (2007))
 *                      V = diag(1, e^{ib}, e^{ia}, e^{i theta} e^{i(a+b)}), a on A and b on B maximising |Tr(V^dag M)|.
 */

export interface Block4 {
  re: Float64Array;
  im: Float64Array;
}

/** Wrap an angle to (-pi, pi]. */
export function wrapAngle(x: number): number {
  let y = x % (2 * Math.PI);
  if (y <= -Math.PI) y += 2 * Math.PI;
  else if (y > Math.PI) y -= 2 * Math.PI;
  return y;
}

function argOf(m: Block4, k: number): number {
  return Math.atan2(m.im[k * 5], m.re[k * 5]);
}

export function conditionalPhase(m: Block4): number {
  return wrapAngle(argOf(m, 3) - argOf(m, 2) - argOf(m, 1) + argOf(m, 0));
}

/** sum_{rc} |M_rc|^2 = Tr(M^dag M) */
export function frobenius2(m: Block4): number {
  let s = 0;
  for (let i = 0; i < 16; i++) s += m.re[i] * m.re[i] + m.im[i] * m.im[i];
  return s;
}

export function leakage(m: Block4): number {
  return 1 - frobenius2(m) / 4;
}

export interface VirtualZ {
  /** Phase on A (as it appears in V). */
  a: number;
  /** Phase on B. */
  b: number;
  /** |Tr(V^dag M)| at the optimum. */
  overlap: number;
}

/**
 * Single-qubit phases a, b maximising |Tr(V^dag M)| with V = diag(1, e^{ib}, e^{ia}, e^{i(theta+a+b)}).
 * Tr(V^dag M) = m0 + e^{-ib} m1 + e^{-ia} (m2 + e^{-i(theta+b)} m3): for fixed b the best a is
 * exact (align the two terms), and likewise for b at fixed a; alternating these exact
 * maximisations increases |Tr| monotonically. Started from the diagonal's phases and from
 * three other corners, the best of the four results is kept.
 */
export function optimalVirtualZ(m: Block4, theta = Math.PI): VirtualZ {
  const d = [0, 1, 2, 3].map((k) => ({ re: m.re[k * 5], im: m.im[k * 5] }));
  const starts: [number, number][] = [];
  const a0 = Math.atan2(d[2].im, d[2].re) - Math.atan2(d[0].im, d[0].re);
  const b0 = Math.atan2(d[1].im, d[1].re) - Math.atan2(d[0].im, d[0].re);
  starts.push([a0, b0], [a0 + Math.PI / 2, b0 - Math.PI / 2], [a0 - Math.PI / 2, b0 + Math.PI / 2], [a0 + Math.PI, b0]);
  let best: VirtualZ = { a: 0, b: 0, overlap: -1 };
  for (const [sa, sb] of starts) {
    let a = sa;
    let b = sb;
    let prev = -1;
    for (let it = 0; it < 200; it++) {
      a = bestPhase(d[0], rot(d[1], -b), d[2], rot(d[3], -(theta + b)));
      b = bestPhase(d[0], rot(d[2], -a), d[1], rot(d[3], -(theta + a)));
      const ov = overlapAt(d, a, b, theta);
      if (ov - prev <= 1e-15 * Math.max(1, ov)) {
        prev = ov;
        break;
      }
      prev = ov;
    }
    if (prev > best.overlap) best = { a: wrapAngle(a), b: wrapAngle(b), overlap: prev };
  }
  return best;
}

interface C {
  re: number;
  im: number;
}

function rot(z: C, phi: number): C {
  const c = Math.cos(phi);
  const s = Math.sin(phi);
  return { re: c * z.re - s * z.im, im: s * z.re + c * z.im };
}

/** phase x maximising |(p0 + p1) + e^{-ix} (q0 + q1)|: x = arg(q) - arg(p). */
function bestPhase(p0: C, p1: C, q0: C, q1: C): number {
  const pr = p0.re + p1.re;
  const pi = p0.im + p1.im;
  const qr = q0.re + q1.re;
  const qi = q0.im + q1.im;
  return Math.atan2(qi, qr) - Math.atan2(pi, pr);
}

function overlapAt(d: C[], a: number, b: number, theta: number): number {
  const t1 = rot(d[1], -b);
  const t2 = rot(d[2], -a);
  const t3 = rot(d[3], -(theta + a + b));
  const re = d[0].re + t1.re + t2.re + t3.re;
  const im = d[0].im + t1.im + t2.im + t3.im;
  return Math.sqrt(re * re + im * im);
}

export interface GateMetrics {
  conditionalPhase: number;
  leakage: number;
  fidelity: number;
  virtualZ: { a: number; b: number };
}

/** All unitary-case metrics of M for target CPhase(theta) (theta = pi: CZ). */
export function gateMetrics(m: Block4, theta = Math.PI): GateMetrics {
  const vz = optimalVirtualZ(m, theta);
  const f2 = frobenius2(m);
  return {
    conditionalPhase: conditionalPhase(m),
    leakage: 1 - f2 / 4,
    fidelity: (f2 + vz.overlap * vz.overlap) / 20,
    virtualZ: { a: vz.a, b: vz.b },
  };
}

/**
 * Average gate fidelity of M to CPhase(theta) with given virtual-Z phases a (on A) and b (on B),
 * V = diag(1, e^{ib}, e^{ia}, e^{i(theta+a+b)}): F = [Tr(M M^dag) + |Tr(V^dag M)|^2] / 20. This is
 * the fidelity of one shot when the lab applies the phases calibrated on the nominal gate.
 */
export function fidelityWithVirtualZ(m: Block4, a: number, b: number, theta = Math.PI): number {
  const ph = [0, b, a, theta + a + b];
  let re = 0;
  let im = 0;
  for (let k = 0; k < 4; k++) {
    const c = Math.cos(ph[k]);
    const s = Math.sin(ph[k]);
    // conj(V_kk) M_kk = e^{-i ph} M_kk
    re += c * m.re[k * 5] + s * m.im[k * 5];
    im += c * m.im[k * 5] - s * m.re[k * 5];
  }
  return (frobenius2(m) + re * re + im * im) / 20;
}
