/**
 * The layout of a campaign before any setting is chosen: which runs share a whole plot (the
 * setting of the hard-to-change factors) and which whole plots share a session (day, shift or
 * batch). The exact design search then fills the layout with settings; the run order only
 * shuffles whole plots inside their session and runs inside their whole plot.
 *
 * Conventions fixed here (documented in the README):
 * - Units. With hard-to-change factors, the fitting runs form `wholePlots` whole plots whose
 *   sizes are as equal as possible (the first N mod W take one run more); every centre
 *   replicate and every holdout run is a whole plot of its own, so that the replicates measure
 *   the whole-plot-to-whole-plot repeatability a reset brings and a holdout tests the model on
 *   a fresh setting. Without hard-to-change factors every run is a unit of its own.
 * - Sessions. The fewest sessions of at most `maxRuns` runs into which the units can be packed
 *   without splitting one. The fitting units fill the sessions largest first, each into the
 *   emptiest session that still has room, counting and where possible keeping the room of the
 *   one-run units aimed at it (the centre replicates' room before the holdouts') (a worst-fit decreasing packing; Johnson, 1974, "Fast
 *   algorithms for bin packing", J. Comput. Syst. Sci. 8); centre replicates then go to the
 *   session nearest an even spread from the first to the last that has room, holdouts likewise
 *   (offset by half a step). The session a set of units lands in is only a label.
 * - Everything is 0-based here; plan.json shows whole plots and sessions 1-based.
 */
import { InputError } from '../inputError.js';
import type { ErrorStructure } from '../model/glsInformation.js';

export type SlotRole = 'fit' | 'centre' | 'holdout' | 'done';

export interface RunLayout {
  /** Role of each slot, in layout order (session by session, whole plot by whole plot). */
  roles: SlotRole[];
  /** Whole plot of each slot. */
  wholePlotOf: Int32Array;
  /** Session of each whole plot. */
  sessionOfWholePlot: Int32Array;
  /** Runs in each whole plot. */
  wholePlotSizes: Int32Array;
  wholePlots: number;
  sessions: number;
  /** True when some whole plot holds more than one run (a split-plot layout). */
  split: boolean;
}

export interface LayoutRequest {
  fitRuns: number;
  centreRuns: number;
  holdoutRuns: number;
  /** Most runs in one session; undefined for a single session. */
  maxRuns?: number;
  /** Whole plots of the fitting runs; undefined when no factor is hard to change. */
  wholePlots?: number;
}

/** The layout of fitting, centre and holdout runs into whole plots and sessions. */
export function layoutRuns(request: LayoutRequest): RunLayout {
  const { fitRuns, centreRuns, holdoutRuns, maxRuns, wholePlots } = request;
  const fitUnits = fitUnitSizes(fitRuns, wholePlots);
  const total = fitRuns + centreRuns + holdoutRuns;
  const largest = fitUnits.length > 0 ? Math.max(...fitUnits) : 1;
  if (maxRuns !== undefined && largest > maxRuns) {
    throw new InputError(
      `a session of at most ${maxRuns} runs cannot hold a whole plot of ${largest} runs; raise sessions.maxRuns or use more whole plots (design.wholePlots)`,
      { key: 'sessions.maxRuns' },
    );
  }
  const capacity = maxRuns ?? total;
  let sessions = Math.max(1, Math.ceil(total / capacity));
  for (;;) {
    const packed = pack(fitUnits, centreRuns, holdoutRuns, sessions, capacity);
    if (packed) return assemble(packed, wholePlots !== undefined);
    sessions++;
  }
}

function fitUnitSizes(fitRuns: number, wholePlots: number | undefined): number[] {
  if (wholePlots === undefined) return Array.from({ length: fitRuns }, () => 1);
  if (!Number.isInteger(wholePlots) || wholePlots < 1 || wholePlots > fitRuns) {
    throw new InputError(`${wholePlots} whole plots cannot be made from ${fitRuns} fitting runs; use a whole number from 1 to ${fitRuns}`, {
      key: 'design.wholePlots',
    });
  }
  const base = Math.floor(fitRuns / wholePlots);
  const extra = fitRuns % wholePlots;
  return Array.from({ length: wholePlots }, (_, w) => base + (w < extra ? 1 : 0));
}

interface Packed {
  /** Per session: the units it holds, as [role, size]. */
  sessions: { role: SlotRole; size: number }[][];
}

function pack(fitUnits: number[], centres: number, holdouts: number, sessions: number, capacity: number): Packed | null {
  const load = new Array<number>(sessions).fill(0);
  const held: { role: SlotRole; size: number }[][] = Array.from({ length: sessions }, () => []);
  const put = (session: number, role: SlotRole, size: number): boolean => {
    if (load[session] + size > capacity) return false;
    load[session] += size;
    held[session].push({ role, size });
    return true;
  };
  const spread = (count: number, offset: number) =>
    Array.from({ length: count }, (_, i) => (count === 1 ? Math.floor((sessions - 1) / 2) : Math.round(((i + offset) * (sessions - 1)) / (count - 1 + offset))));
  // The fitting units first, largest first, each into the emptiest session with room; the
  // one-run units (centre replicates, holdouts) then fill in near their spread positions, so
  // that they never force an extra session on the larger units.
  const centreTargets = spread(centres, 0);
  const holdoutTargets = spread(holdouts, 0.5);
  const reservedCentres = new Array<number>(sessions).fill(0);
  for (const s of centreTargets) reservedCentres[s]++;
  const reserved = [...reservedCentres];
  for (const s of holdoutTargets) reserved[s]++;
  const order = fitUnits.map((size, i) => ({ size, i })).sort((a, b) => b.size - a.size || a.i - b.i);
  for (const unit of order) {
    // The emptiest session counting the one-run units aimed at it, keeping their room when possible.
    let target = -1;
    for (const keep of [reserved, reservedCentres, null]) {
      for (let s = 0; s < sessions; s++) {
        const room = load[s] + unit.size + (keep ? keep[s] : 0) <= capacity;
        if (room && (target < 0 || load[s] + reserved[s] < load[target] + reserved[target])) target = s;
      }
      if (target >= 0) break;
    }
    if (target < 0) return null;
    put(target, 'fit', unit.size);
  }
  for (const session of centreTargets) if (!putNear(session, 'centre')) return null;
  for (const session of holdoutTargets) if (!putNear(session, 'holdout')) return null;
  return { sessions: held };

  function putNear(session: number, role: SlotRole): boolean {
    for (let step = 0; step < sessions; step++) {
      for (const s of [session + step, session - step]) if (s >= 0 && s < sessions && put(s, role, 1)) return true;
    }
    return false;
  }
}

function assemble(packed: Packed, split: boolean): RunLayout {
  const roles: SlotRole[] = [];
  const wholePlotOf: number[] = [];
  const sessionOfWholePlot: number[] = [];
  const sizes: number[] = [];
  packed.sessions.forEach((units, session) => {
    // Fitting units first inside a session, then centre, then holdout: layout order only.
    const ordered = [...units.filter((u) => u.role === 'fit'), ...units.filter((u) => u.role !== 'fit')];
    for (const unit of ordered) {
      const w = sizes.length;
      sizes.push(unit.size);
      sessionOfWholePlot.push(session);
      for (let r = 0; r < unit.size; r++) {
        roles.push(unit.role);
        wholePlotOf.push(w);
      }
    }
  });
  return {
    roles,
    wholePlotOf: Int32Array.from(wholePlotOf),
    sessionOfWholePlot: Int32Array.from(sessionOfWholePlot),
    wholePlotSizes: Int32Array.from(sizes),
    wholePlots: sizes.length,
    sessions: packed.sessions.length,
    split: split && sizes.some((size) => size > 1),
  };
}

/** The error structure of the fitted runs of a layout (holdouts left out) and where each sits. */
export interface FittedStructure {
  structure: ErrorStructure;
  /** Layout slot of each fitted run, in layout order. */
  slots: number[];
}

/**
 * The whole plots and sessions of the fitted runs (fitting runs and centre replicates): the
 * holdout slots are dropped, and whole plots and sessions renumbered from 0 in layout order,
 * so that a session holding only holdouts does not count.
 */
export function fittedStructure(layout: RunLayout, varianceRatio: number): FittedStructure {
  const slots: number[] = [];
  layout.roles.forEach((role, i) => {
    if (role === 'fit' || role === 'centre' || role === 'done') slots.push(i);
  });
  const plotIndex = new Map<number, number>();
  const sessionIndex = new Map<number, number>();
  const sessionOfPlot: number[] = [];
  const wholePlotOf = Int32Array.from(slots, (slot) => {
    const w = layout.wholePlotOf[slot];
    let renumbered = plotIndex.get(w);
    if (renumbered === undefined) {
      renumbered = plotIndex.size;
      plotIndex.set(w, renumbered);
      const session = layout.sessionOfWholePlot[w];
      if (!sessionIndex.has(session)) sessionIndex.set(session, sessionIndex.size);
      sessionOfPlot.push(sessionIndex.get(session)!);
    }
    return renumbered;
  });
  return {
    structure: {
      wholePlotOf,
      sessionOfWholePlot: Int32Array.from(sessionOfPlot),
      wholePlots: plotIndex.size,
      sessions: Math.max(1, sessionIndex.size),
      varianceRatio,
    },
    slots,
  };
}
