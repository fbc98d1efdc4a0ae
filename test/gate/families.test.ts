/**
 * Ramp families against the equations that define them (each family's published method) and
 * against mathjs's erf.
 */
import { describe, expect, it } from 'vitest';
import { erf as mathErf } from 'mathjs';
import { RAMP_FAMILIES } from '../../src/gate/families/index.js';
import { erf } from '../../src/gate/families/erf.js';
import { faquadFamily } from '../../src/gate/families/faquad.js';
import { fastAdiabaticFamily, fourierShape, FAST_ADIABATIC_DEFAULTS } from '../../src/gate/families/fast-adiabatic.js';
import { gaussianWidth, squeezingAwareFamily } from '../../src/gate/families/squeezing-aware.js';
import { BARE_CROSSING, CTX, Q1, TABLE } from './support.js';

const DEST = 0.97 * BARE_CROSSING;
const input = (rampNs: number) => ({ ctx: CTX, table: TABLE, parkFlux: 0, destFlux: DEST, rampNs });

describe('ramp families', () => {
  it('every family starts at the parking flux, ends at the destination and moves monotonically', () => {
    for (const f of RAMP_FAMILIES) {
      const ramp = f.ramp(input(10));
      expect(ramp(0)).toBe(0);
      expect(ramp(10)).toBe(DEST);
      let prev = -Infinity;
      for (let k = 0; k <= 200; k++) {
        const x = ramp((10 * k) / 200);
        expect(x).toBeGreaterThanOrEqual(prev - 1e-12);
        prev = x;
      }
    }
  });

  it('erf(x) agrees with mathjs.erf to 1e-14', () => {
    for (let x = -4; x <= 4; x += 0.137) expect(Math.abs(erf(x) - (mathErf(x) as number))).toBeLessThan(1e-14);
  });

  it('faquad spends time in proportion to int mu dPhi, i.e. mu dPhi/dw is constant in its warped time w (Martinez-Garaot et al. 2015)', () => {
    const ramp = faquadFamily.ramp(input(10));
    // mu: the crossing's |d theta/dPhi| / (2 gap), plus (our documented extension) the other
    // 2-excitation crossing's and the mover's squeezing parameter
    const mu = (x: number): number => {
      const h = 1e-7;
      const dth = (TABLE.at(x + h).theta - TABLE.at(x - h).theta) / (2 * h);
      const dtho = (TABLE.otherCrossing(x + h).theta - TABLE.otherCrossing(x - h).theta) / (2 * h);
      return Math.abs(dth) / (2 * TABLE.at(x).gapGHz) + Math.abs(dtho) / (2 * TABLE.otherCrossing(x).gapGHz) + TABLE.squeezing(x);
    };
    // int_0^x mu by Simpson's rule on 4000 intervals
    const integral = (x: number): number => {
      const n = 4000;
      const h = x / n;
      let acc = mu(0) + mu(x);
      for (let k = 1; k < n; k++) acc += (k % 2 === 1 ? 4 : 2) * mu(k * h);
      return (acc * h) / 3;
    };
    const total = integral(DEST);
    for (let k = 1; k < 10; k++) {
      const warped = 0.5 - 0.5 * Math.cos((Math.PI * k) / 10);
      expect(Math.abs(integral(ramp(k)) / total - warped)).toBeLessThan(3e-3);
    }
  });

  it('fast-adiabatic follows theta(t) = theta_park + (theta_dest - theta_park) s(t) with its Fourier shape (Martinis and Geller 2014)', () => {
    const ramp = fastAdiabaticFamily.ramp(input(10));
    const t0 = TABLE.at(0).theta;
    const t1 = TABLE.at(DEST).theta;
    for (let k = 1; k < 20; k++) {
      const tau = k / 20;
      const expected = t0 + (t1 - t0) * fourierShape(FAST_ADIABATIC_DEFAULTS.coefficients, tau);
      expect(Math.abs(TABLE.at(ramp(10 * tau)).theta - expected)).toBeLessThan(2e-4);
    }
    // s(0) = 0, s(1) = 1
    expect(fourierShape([1, 0.3, -0.1], 0)).toBe(0);
    expect(fourierShape([1, 0.3, -0.1], 1)).toBeCloseTo(1, 14);
  });

  it('squeezing-aware: integrating the width equation under its E_J(t) brings sigma to rest at the destination width (RK4, independent)', () => {
    const rampNs = 6;
    const ramp = squeezingAwareFamily.ramp(input(rampNs));
    const ec = Q1.ecGHz;
    const s0 = gaussianWidth(ec, Q1.ejGHz(0));
    const s1 = gaussianWidth(ec, Q1.ejGHz(DEST));
    // static width check: sigma^4 e^{-sigma^2/2} = 2 E_C / E_J, and the harmonic limit sqrt(2 E_C/E_J) (Koch 2007) within 5 %
    expect(Math.abs(s0 ** 4 * Math.exp(-0.5 * s0 * s0) - (2 * ec) / Q1.ejGHz(0))).toBeLessThan(1e-14);
    expect(Math.abs(s0 * s0 - Math.sqrt((2 * ec) / Q1.ejGHz(0))) / (s0 * s0)).toBeLessThan(0.05);
    const w = (2 * Math.PI) ** 2;
    const acc = (t: number, s: number): number => w * ((16 * ec * ec) / s ** 3 - 8 * ec * Q1.ejGHz(ramp(t)) * s * Math.exp(-0.5 * s * s));
    let s = s0;
    let v = 0;
    const n = 20000;
    const h = rampNs / n;
    for (let k = 0; k < n; k++) {
      const t = k * h;
      const k1s = v;
      const k1v = acc(t, s);
      const k2s = v + 0.5 * h * k1v;
      const k2v = acc(t + 0.5 * h, s + 0.5 * h * k1s);
      const k3s = v + 0.5 * h * k2v;
      const k3v = acc(t + 0.5 * h, s + 0.5 * h * k2s);
      const k4s = v + h * k3v;
      const k4v = acc(t + h, s + h * k3s);
      s += (h / 6) * (k1s + 2 * k2s + 2 * k3s + k4s);
      v += (h / 6) * (k1v + 2 * k2v + 2 * k3v + k4v);
    }
    // the ramp table (200 points, linear in between) limits the agreement
    expect(Math.abs(s - s1) / s1).toBeLessThan(1e-3);
    expect(Math.abs(v) * rampNs / s1).toBeLessThan(5e-3);
  });

  it('squeezing-aware reports a ramp too short for the E_J range as infeasible', () => {
    expect(() => squeezingAwareFamily.ramp(input(0.005))).toThrow(/outside its range/);
  });
});
