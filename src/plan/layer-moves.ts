/**
 * Spectator moves fitted to the layers (README "Interaction plan, spectators, layers").
 *
 * Each edge is planned on its own (./interaction/plan-edge.ts): besides the spectator moves a
 * rule asks for, it moves spectators only to lower its own estimated error (budgetMoves). Such a
 * move occupies the spectator for the gate's slot, so no other gate touching that qubit can share
 * the layer (./layers.ts, conflict kind 'spectator'); on a chip these optional moves can double
 * the layer count, and every qubit then idles longer in each cycle. The reference cycle's error
 * (./cycle-budget.ts) weighs both: the gates' errors and the idles over the cycle's duration.
 *
 * Spectators two gates move to the very same point do not keep the gates apart (./layers.ts), so
 * the fitting builds two more candidates and keeps, of the three, the one of least predicted
 * cycle error (ties: the earlier):
 *   planned  the edges as each planned itself;
 *   aligned  each spectator moved by two or more gates goes, for every gate that still holds its
 *            rules there, to the one point among theirs that the most of them accept
 *            (alignSpectatorPoints);
 *   fitted   the optional moves fitted to the layers of the aligned edges, then aligned again:
 *     1. every edge that made an optional move is evaluated again without its optional moves,
 *        and the layers of these plans are coloured (the moves a rule asks for stay);
 *     2. edge by edge (in edge order), the edge keeps those of its optional moves no other gate
 *        of its layer touches, when the result holds its rules and conflicts with no gate of its
 *        layer (./layers.ts gatesConflict, tested there as conflictKind), else it keeps its plan from step 1;
 *     3. the layers are coloured again starting from that assignment (repaired where needed).
 * Deterministic: the same plans and seed give the same result.
 */
import { BUDGET_MOVE_REASON, withSpectatorPointsDraft, withoutSpectators, type EdgeContext, type EdgePlan, type EdgePlanDraft, type ParkedSpectator } from './interaction/plan-edge.js';
import { ConflictCache, conflictKind, explainLayers, nearLists, planLayers, touchedQubits, type LayerPlan } from './layers.js';

export interface FittedLayers {
  edges: EdgePlan[];
  layers: LayerPlan;
  /** What the fitting did (null when it did not run: no spectator move, or layers at the lower bound). */
  fitting: LayerFitting | null;
}

export interface LayerFitting {
  /** Layers and predicted cycle error of the plan as each edge planned itself, with shared spectator points, and with optional moves fitted to the layers too. */
  planned: FittingStep;
  aligned: FittingStep;
  fitted: FittingStep;
  /** Which one the plan keeps. */
  kept: 'planned' | 'aligned' | 'fitted';
}

export interface FittingStep {
  layers: number;
  cycleError: number;
  /** Spectator moves in all, and those made only for a lower estimated error. */
  moves: number;
  optionalMoves: number;
}

/** The spectators an edge plan moved only for a lower estimated error (no rule asked for it). */
export const optionalMoves = (e: EdgePlan): number[] => e.parked.filter((p) => p.reason === BUDGET_MOVE_REASON).map((p) => p.qubit);

type CycleError = (edges: readonly EdgePlan[], layers: LayerPlan) => number;

export function fitMovesToLayers(
  ec: EdgeContext,
  edges: readonly EdgePlan[],
  parkingF12: readonly number[],
  parkingGHz: ArrayLike<number>,
  /** The predicted cycle error of a set of edge plans in given layers (./plan-budget.ts). */
  cycleError: CycleError,
  /** false: the kept layers without their kind-by-kind explanation (its counts NaN: planLayers with explain false), for callers that do not report it. */
  explain = true,
): FittedLayers {
  const { ctx } = ec;
  // the candidates share most plan objects: their moved qubits and pair conflicts are worked out once
  const cache = new ConflictCache(parkingF12, parkingGHz);
  const quiet = { explain: false, cache };
  const layers = planLayers(ctx, edges, parkingF12, parkingGHz, 1, undefined, quiet);
  const explained = (list: readonly EdgePlan[], l: LayerPlan): LayerPlan => (explain ? explainLayers(ctx, list, parkingF12, parkingGHz, l, 1, cache) : l);
  if (!edges.some((e) => e.parked.length > 0) || layers.layers.length <= layers.lowerBound) return { edges: [...edges], layers: explained(edges, layers), fitting: null };
  const step = (list: readonly EdgePlan[], l: LayerPlan): FittingStep => ({
    layers: l.layers.length,
    cycleError: cycleError(list, l),
    moves: list.reduce((a, e) => a + e.parked.length, 0),
    optionalMoves: list.reduce((a, e) => a + optionalMoves(e).length, 0),
  });
  const planned = { edges: [...edges], layers, step: step(edges, layers) };
  const moves: SpectatorMoveMemo = new WeakMap();
  const alignedEdges = alignSpectatorPoints(ec, edges, moves);
  // (aligning changed no plan: the same plans give the same layers and cycle error, not coloured again)
  const unchanged = samePlans(alignedEdges, edges);
  const alignedLayers = unchanged ? copyLayers(layers) : planLayers(ctx, alignedEdges, parkingF12, parkingGHz, 1, undefined, quiet);
  const aligned = { edges: alignedEdges, layers: alignedLayers, step: unchanged ? { ...planned.step } : step(alignedEdges, alignedLayers) };
  const fit = fitOptionalMoves(ec, alignedEdges, cache);
  // the fitting's layers are the start (planLayers repairs them where aligning again split a shared point)
  const fittedEdges = alignSpectatorPoints(ec, fit.edges, moves);
  const fittedLayers = planLayers(ctx, fittedEdges, parkingF12, parkingGHz, 1, fit.layerOf, quiet);
  const fitted = { edges: fittedEdges, layers: fittedLayers, step: step(fittedEdges, fittedLayers) };
  const all = { planned, aligned, fitted } as const;
  let kept: LayerFitting['kept'] = 'planned';
  for (const k of ['aligned', 'fitted'] as const) if (all[k].step.cycleError < all[kept].step.cycleError) kept = k;
  const keptLayers = explained(all[kept].edges, all[kept].layers);
  return { edges: all[kept].edges, layers: keptLayers, fitting: { planned: planned.step, aligned: aligned.step, fitted: fitted.step, kept } };
}

/** The same plan objects in the same order. */
const samePlans = (a: readonly EdgePlan[], b: readonly EdgePlan[]): boolean => a.length === b.length && a.every((x, i) => x === b[i]);

/** A copy of a layer plan (its lists new). */
const copyLayers = (l: LayerPlan): LayerPlan => ({ ...l, layerOf: [...l.layerOf], layers: l.layers.map((x) => [...x]), explanation: { ...l.explanation, pairs: { ...l.explanation.pairs } } });

/**
 * One temporary point per spectator where the gates allow it: for each spectator moved by two or
 * more gates (in qubit order), the point among theirs that the most of those gates accept (their
 * rules still hold there; ties: the lower sum of their estimated errors, then the lower
 * frequency); each gate that accepts it moves the spectator there.
 */
export function alignSpectatorPoints(ec: EdgeContext, edges: readonly EdgePlan[], memo: SpectatorMoveMemo = new WeakMap()): EdgePlan[] {
  const out = [...edges];
  const users = new Map<number, number[]>();
  out.forEach((e, k) => {
    for (const p of e.parked) {
      let list = users.get(p.qubit);
      if (!list) users.set(p.qubit, (list = []));
      list.push(k);
    }
  });
  for (const S of [...users.keys()].sort((a, b) => a - b)) {
    const list = users.get(S)!;
    if (list.length < 2) continue;
    const pointOf = (k: number) => out[k].parked.find((p) => p.qubit === S)!;
    const points = [...new Map(list.map((k) => [pointOf(k).fGHz, pointOf(k)])).values()].sort((a, b) => a.fGHz - b.fGHz);
    if (points.length < 2) continue;
    // (candidates are compared by score; only the kept point's plans are built: EdgePlanDraft)
    let best: { accepted: (EdgePlan | EdgePlanDraft)[]; who: number[]; error: number } | null = null;
    for (const at of points) {
      const accepted: (EdgePlan | EdgePlanDraft)[] = [];
      const who: number[] = [];
      let error = 0;
      let lost = false;
      for (let j = 0; j < list.length; j++) {
        // (a point that can no longer beat the best so far is left: even if every gate left
        // accepted it, it would gather fewer gates, or as many with an error sum (estimates are
        // >= 0, so the sum only grows) already no lower; the choice is the one evaluating all)
        const most = who.length + list.length - j;
        if (best && (most < best.who.length || (most === best.who.length && error >= best.error))) {
          lost = true;
          break;
        }
        const k = list[j];
        const e = pointOf(k).fGHz === at.fGHz ? out[k] : movedTo(ec, memo, out[k], S, at);
        if (!e) continue;
        accepted.push(e);
        who.push(k);
        error += e.score;
      }
      if (lost) continue;
      if (!best || who.length > best.who.length || (who.length === best.who.length && error < best.error)) best = { accepted, who, error };
    }
    if (best && best.who.length >= 2) best.who.forEach((k, i) => (out[k] = planOf(best!.accepted[i])));
  }
  return out;
}

/**
 * withSpectatorPointsDraft(ec, plan, {S: at}) remembered per plan object, spectator and point (the
 * fitting aligns twice, the second time mostly the same plans): the same score and plan (one
 * object, built when a point is kept) or null as evaluating it again, as long as `ec` is the same
 * (one memo per fitMovesToLayers call).
 */
export type SpectatorMoveMemo = WeakMap<EdgePlan, Map<number, Map<number, { flux: number; f12GHz: number; result: EdgePlanDraft | null }>>>;

/** The plan of a draft (built once: the same object every time), or the plan itself. */
const planOf = (e: EdgePlan | EdgePlanDraft): EdgePlan => ('plan' in e && typeof e.plan === 'function' ? e.plan() : (e as EdgePlan));

function movedTo(ec: EdgeContext, memo: SpectatorMoveMemo, plan: EdgePlan, S: number, at: Pick<ParkedSpectator, 'fGHz' | 'flux' | 'f12GHz'>): EdgePlanDraft | null {
  // (keyed by spectator, then by f01 as a number: distinct doubles are distinct keys, 0 and -0
  // one, as their decimal strings were)
  let byQubit = memo.get(plan);
  if (!byQubit) memo.set(plan, (byQubit = new Map()));
  let row = byQubit.get(S);
  if (!row) byQubit.set(S, (row = new Map()));
  const hit = row.get(at.fGHz);
  if (hit && hit.flux === at.flux && hit.f12GHz === at.f12GHz) return hit.result;
  const result = withSpectatorPointsDraft(ec, plan, new Map([[S, at]]));
  row.set(at.fGHz, { flux: at.flux, f12GHz: at.f12GHz, result });
  return result;
}

/**
 * Optional moves fitted to the layers (steps 1-2 of the banner): the layers of the edges without
 * optional moves, then each edge's optional moves back where its layer carries them. Edges are
 * evaluated again with fewer spectators moved, not planned again (the moves a rule asked for
 * stay where they are); an edge whose rules would break keeps its moves.
 */
export function fitOptionalMoves(ec: EdgeContext, edges: readonly EdgePlan[], cache: ConflictCache): { edges: EdgePlan[]; layerOf?: Int32Array } {
  const { ctx } = ec;
  const { parkingF12, parkingGHz } = cache;
  const withMoves = edges.map((e, k) => (optionalMoves(e).length > 0 ? k : -1)).filter((k) => k >= 0);
  if (withMoves.length === 0) return { edges: [...edges] };
  // 1. without optional moves
  const fitted = [...edges];
  for (const k of withMoves) fitted[k] = withoutSpectators(ec, edges[k], new Set(optionalMoves(edges[k]))) ?? edges[k];
  const bare = planLayers(ctx, fitted, parkingF12, parkingGHz, 1, undefined, { explain: false, cache });
  const layerOf = Int32Array.from(bare.layerOf);
  // 2. optional moves back where the layers carry them
  const members: number[][] = Array.from({ length: bare.layers.length }, () => []);
  layerOf.forEach((c, j) => members[c].push(j));
  // per layer, how many of its plans occupy each qubit (touchedQubits), kept up to date as plans
  // are replaced: a qubit is busy for plan k when a plan of k's layer other than k occupies it
  // (a plan occupies a qubit at most once), the set of the other plans' qubits without building it
  const occupancy = members.map((list) => {
    const count = new Int32Array(ctx.n);
    for (const j of list) for (const q of touchedQubits(fitted[j])) count[q]++;
    return count;
  });
  // per qubit, the plans occupying it (kept up to date as plans are replaced): a plan can conflict
  // with a candidate only by occupying one of the candidate's qubits or a neighbour or next-nearest
  // neighbour of a qubit the candidate moves (./layers.ts rules a-c), so only those are tested
  const occupants: number[][] = Array.from({ length: ctx.n }, () => []);
  fitted.forEach((g, j) => {
    for (const q of touchedQubits(g)) occupants[q].push(j);
  });
  const near = nearLists(ctx);
  const seen = new Int32Array(fitted.length).fill(-1);
  for (const k of withMoves) {
    if (fitted[k] === edges[k]) continue;
    const count = occupancy[layerOf[k]];
    const own = fitted[k];
    const dropped = new Set(optionalMoves(edges[k]).filter((q) => count[q] - (occupies(own, q) ? 1 : 0) > 0));
    if (dropped.size === optionalMoves(edges[k]).length) continue;
    const candidate = dropped.size === 0 ? edges[k] : withoutSpectators(ec, edges[k], dropped);
    if (!candidate) continue;
    const moved = cache.movedOf(ctx, candidate);
    // (conflictKind is null exactly when gatesConflict is false for plans that do not park their own
    // mover or partner, which no planned gate does: the same rules without sets; tested)
    // (whether any plan of its layer clashes: the plans that can are tested, each once)
    let clash = false;
    const layer = layerOf[k];
    const test = (q: number): boolean => {
      for (const j of occupants[q]) {
        if (j === k || seen[j] === k || layerOf[j] !== layer) continue;
        seen[j] = k;
        if (conflictKind(ctx, candidate, moved, fitted[j], cache.movedOf(ctx, fitted[j])) !== null) return true;
      }
      return false;
    };
    for (const q of touchedQubits(candidate)) if ((clash = test(q))) break;
    if (!clash) {
      outer: for (const x of moved) {
        const list = near[x.qubit];
        for (let i = 0; i < list.length; i++) if ((clash = test(list[i]))) break outer;
      }
    }
    if (!clash) {
      for (const q of touchedQubits(own)) {
        count[q]--;
        occupants[q].splice(occupants[q].indexOf(k), 1);
      }
      for (const q of touchedQubits(candidate)) {
        count[q]++;
        occupants[q].push(k);
      }
      fitted[k] = candidate;
    }
  }
  return { edges: fitted, layerOf };
}

/** True when plan g occupies qubit q (touchedQubits(g) includes q). */
function occupies(g: EdgePlan, q: number): boolean {
  if (q === g.mover || q === g.partner) return true;
  for (let i = 0; i < g.parked.length; i++) if (g.parked[i].qubit === q) return true;
  return false;
}
