/**
 * Colours of the report's data: parking frequency (a sequential ramp of our own, indigo through
 * teal and straw to brick), predicted gate error (green to red on a log scale), parallel layers
 * (twelve distinct hues) and the parts of an error budget.
 */
import { interpolateRgbBasis } from 'd3-interpolate';
import { scaleSequential, scaleSequentialLog, type ScaleSequential } from 'd3-scale';
import type { GATE_BUDGET_PARTS, IDLE_BUDGET_PARTS } from '../document.js';

export const PARKING_RAMP = interpolateRgbBasis(['#2b2d6e', '#2a6f97', '#3fa68b', '#c9c45a', '#f0a24a', '#c8473b']);
export const ERROR_RAMP = interpolateRgbBasis(['#2f8f5b', '#9bbf4a', '#e8b93c', '#e07b39', '#a82d25']);
export const UNKNOWN_COLOUR = '#b9b4a8';
export const VIOLATION_COLOUR = '#c2362b';
export const FLAG_COLOUR = '#b87a00';
export const ACCENT = '#1f6f78';

/** Parking frequency (GHz) -> fill colour. */
export function parkingScale(loGHz: number, hiGHz: number): ScaleSequential<string> {
  const lo = Number.isFinite(loGHz) ? loGHz : 4;
  const hi = Number.isFinite(hiGHz) && hiGHz > lo ? hiGHz : lo + 1;
  return scaleSequential(PARKING_RAMP).domain([lo, hi]);
}

/** The predicted-error range drawn; errors outside it take the end colours. */
export const ERROR_DOMAIN: [number, number] = [1e-4, 1e-1];

export function errorScale(): ScaleSequential<string> {
  return scaleSequentialLog(ERROR_RAMP).domain(ERROR_DOMAIN).clamp(true);
}

const LAYERS = ['#1f6f78', '#d1495b', '#e0a030', '#3d5a80', '#6a4c93', '#7aa95c', '#e76f51', '#00a6a6', '#9c6644', '#b56576', '#4a7c59', '#8d99ae'];

export function layerColour(layer: number | null): string {
  if (layer === null || layer < 0) return UNKNOWN_COLOUR;
  return LAYERS[layer % LAYERS.length];
}

/** Dash pattern distinguishing layers that share a hue (from the 13th layer on). */
export function layerDash(layer: number | null): string | null {
  if (layer === null) return null;
  const round = Math.floor(layer / LAYERS.length);
  return round === 0 ? null : round === 1 ? '6 3' : '2 3';
}

export const GATE_BUDGET_COLOURS: Record<(typeof GATE_BUDGET_PARTS)[number], string> = {
  coherent: '#3d5a80',
  t1: '#d1495b',
  whiteDephasing: '#e0a030',
  fluxNoise: '#6a4c93',
  spectators: '#1f6f78',
  sweptCrossings: '#e76f51',
  spectatorMoves: '#7aa95c',
};

export const GATE_BUDGET_LABELS: Record<(typeof GATE_BUDGET_PARTS)[number], string> = {
  coherent: 'coherent (leakage, phase)',
  t1: 'T1',
  whiteDephasing: 'white dephasing',
  fluxNoise: 'flux noise',
  spectators: 'spectators',
  sweptCrossings: 'swept crossings',
  spectatorMoves: 'spectator moves',
};

export const IDLE_BUDGET_LABELS: Record<(typeof IDLE_BUDGET_PARTS)[number], string> = {
  t1: 'T1',
  dephasing: 'dephasing',
  zz: 'static ZZ',
  thermal: 'thermal',
};
