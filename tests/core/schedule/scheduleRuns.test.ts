import { describe, expect, it } from 'vitest';
import { scheduleRuns } from '../../../src/core/schedule/scheduleRuns.js';
import { sprayDryerPlan } from '../../fixtures/plan/sprayDryerPlan.js';

function withoutHardToChange() {
  const plan = sprayDryerPlan();
  for (const factor of plan.study.factors) delete factor.hardToChange;
  return plan;
}

describe('scheduleRuns without hard-to-change factors', () => {
  it('is reproducible for a seed and differs across seeds', () => {
    const plan = withoutHardToChange();
    const a = scheduleRuns(plan, 11);
    const b = scheduleRuns(plan, 11);
    const c = scheduleRuns(plan, 12);
    expect(a).toEqual(b);
    expect(a.order.map((r) => r.point)).not.toEqual(c.order.map((r) => r.point));
    expect(a.seed).toBe(11);
    expect(a.hardToChange).toBeNull();
  });

  it('schedules every run once with sequence 1..n', () => {
    const plan = withoutHardToChange();
    const schedule = scheduleRuns(plan, 3);
    expect(schedule.order.map((r) => r.sequence)).toEqual(Array.from({ length: 18 }, (_, i) => i + 1));
    expect(schedule.order.map((r) => r.point).sort()).toEqual(plan.runs.map((r) => r.point).sort());
  });

  it('spreads 3 centre replicates over the first, middle and last session', () => {
    for (const seed of [1, 2, 3, 4]) {
      const schedule = scheduleRuns(withoutHardToChange(), seed);
      const centres = schedule.order.filter((r) => r.purpose === 'centre');
      expect(centres.map((r) => r.sequence)).toEqual([1, 10, 18]);
      expect(centres.map((r) => r.session)).toEqual([1, 2, 3]);
    }
  });

  it('spreads centres over thirds when there are no sessions', () => {
    const plan = withoutHardToChange();
    delete plan.study.sessions;
    const schedule = scheduleRuns(plan, 8);
    const n = schedule.order.length;
    const thirds = schedule.order.filter((r) => r.purpose === 'centre').map((r) => Math.floor(((r.sequence - 1) * 3) / n));
    expect(thirds).toEqual([0, 1, 2]);
    expect(schedule.sessionCount).toBe(1);
    expect(schedule.sessionLabel).toBe('Session');
    expect(new Set(schedule.order.map((r) => r.session))).toEqual(new Set([1]));
  });

  it('never puts more than maxRuns in a session and uses the fewest sessions', () => {
    for (const maxRuns of [4, 5, 6, 7, 18, 40]) {
      const plan = withoutHardToChange();
      plan.study.sessions = { maxRuns, label: 'Shift' };
      const schedule = scheduleRuns(plan, 5);
      expect(schedule.sessionCount).toBe(Math.ceil(18 / maxRuns));
      const sizes = new Map<number, number>();
      for (const run of schedule.order) sizes.set(run.session, (sizes.get(run.session) ?? 0) + 1);
      for (const size of sizes.values()) expect(size).toBeLessThanOrEqual(maxRuns);
      expect(Math.max(...sizes.values()) - Math.min(...sizes.values())).toBeLessThanOrEqual(1);
      expect(schedule.sessionLabel).toBe('Shift');
    }
  });

  it('mixes holdout runs in among the fit runs rather than at the end', () => {
    const lastHoldout = [1, 2, 3, 4, 5, 6, 7, 8].map((seed) => {
      const order = scheduleRuns(withoutHardToChange(), seed).order;
      return order.filter((r) => r.purpose === 'holdout').map((r) => r.sequence);
    });
    // Across seeds the holdout positions vary (they are randomised, not appended).
    expect(new Set(lastHoldout.map((p) => p.join(','))).size).toBeGreaterThan(4);
  });
});

describe('scheduleRuns with a hard-to-change factor', () => {
  it('groups by inlet temperature with the fewest changes and says so', () => {
    const plan = sprayDryerPlan();
    delete plan.study.sessions;
    const schedule = scheduleRuns(plan, 20261201);
    expect(schedule.hardToChange).not.toBeNull();
    expect(schedule.hardToChange!.factors).toEqual(['inlet_temp']);
    // 5 distinct settings (160, 170, 180, 190, 200) → at least 4 changes; grouping reaches 4.
    expect(schedule.hardToChange!.levelChanges).toBe(4);
    expect(schedule.hardToChange!.note).toMatch(/not counting the first set-up/);
    expect(schedule.hardToChange!.note).toMatch(/fewest possible/);
    const byPoint = new Map(plan.runs.map((r) => [r.point, r]));
    const temps = schedule.order.map((r) => byPoint.get(r.point)!.settings.inlet_temp);
    let changes = 0;
    for (let i = 1; i < temps.length; i++) if (temps[i] !== temps[i - 1]) changes++;
    expect(changes).toBe(4);
  });

  it('ignores a hard-to-change flag on a factor the plan holds fixed', () => {
    const plan = withoutHardToChange();
    plan.study.factors.find((f) => f.id === 'air_flow')!.hardToChange = true;
    expect(scheduleRuns(plan, 1).hardToChange).toBeNull();
  });

  it('keeps groups whole across sessions when the maximum allows it', () => {
    const plan = sprayDryerPlan();
    plan.study.sessions = { maxRuns: 8, label: 'Day' };
    for (const seed of [1, 2, 3]) {
      const schedule = scheduleRuns(plan, seed);
      expect(schedule.sessionCount).toBe(3);
      const byPoint = new Map(plan.runs.map((r) => [r.point, r]));
      const sessionsOfSetting = new Map<number, Set<number>>();
      for (const run of schedule.order) {
        const t = byPoint.get(run.point)!.settings.inlet_temp;
        if (!sessionsOfSetting.has(t)) sessionsOfSetting.set(t, new Set());
        sessionsOfSetting.get(t)!.add(run.session);
      }
      for (const sessions of sessionsOfSetting.values()) expect(sessions.size).toBe(1);
      expect(schedule.hardToChange!.levelChanges).toBe(4);
    }
  });

  it('splits a group that cannot fit a session and says so, still within maxRuns', () => {
    const plan = sprayDryerPlan(); // the 180 °C group has 7 runs, sessions hold 6
    const schedule = scheduleRuns(plan, 4);
    expect(schedule.sessionCount).toBe(3);
    const sizes = [1, 2, 3].map((s) => schedule.order.filter((r) => r.session === s).length);
    expect(sizes).toEqual([6, 6, 6]);
    expect(schedule.hardToChange!.note).toMatch(/continue into the next day/);
    expect(schedule.hardToChange!.levelChanges).toBe(4);
  });
});

describe('what the notes say about the centre replicates under grouping', () => {
  it('lists the centre runs and says they stay in the block they share', () => {
    const plan = sprayDryerPlan(); // fit runs at 180 °C share the centre setting
    const schedule = scheduleRuns(plan, 20261201);
    const centres = schedule.order.filter((r) => r.purpose === 'centre').map((r) => r.sequence);
    expect(schedule.note).toContain(`centre repeats are runs ${centres[0]}, ${centres[1]} and ${centres[2]}`);
    expect(schedule.hardToChange!.note).toMatch(/stay in that block/);
  });

  it('counts what spreading lone centre replicates costs in setting changes', () => {
    const plan = sprayDryerPlan();
    delete plan.study.sessions;
    // Move the 180 °C fit runs to 190 °C, so no other run shares the centre setting.
    for (const run of plan.runs) if (run.purpose === 'fit' && run.settings.inlet_temp === 180) run.settings.inlet_temp = 190;
    const schedule = scheduleRuns(plan, 7);
    const centres = schedule.order.filter((r) => r.purpose === 'centre').map((r) => r.sequence);
    expect(centres[0]).toBe(1);
    expect(centres[2]).toBe(18);
    // Settings 160, 170, 180, 190, 200 → 4 changes if the centres ran back to back; the spread
    // costs more, counted by hand along the sequence below.
    const byPoint = new Map(plan.runs.map((r) => [r.point, r]));
    const temps = schedule.order.map((r) => byPoint.get(r.point)!.settings.inlet_temp);
    let changes = 0;
    for (let i = 1; i < temps.length; i++) if (temps[i] !== temps[i - 1]) changes++;
    expect(schedule.hardToChange!.levelChanges).toBe(changes);
    expect(changes).toBeGreaterThan(4);
    expect(schedule.hardToChange!.note).toContain(`(4 changes would do if they ran back to back; spreading them costs the other ${changes - 4})`);
  });
});

