/**
 * Capital-budget selection of a screening: a multiple-choice 0/1 knapsack. Each motor offers a few
 * options (each with a capex and an NPV); pick at most one option per motor so that the total capex
 * stays within the budget and the total NPV is highest.
 *
 * Method: dynamic programming over the Pareto frontier of (capex, NPV) states, in integer cents.
 * Motor by motor, every state either skips the motor or adds one of its options; states over the
 * budget are dropped and dominated states (more capex for no more NPV) are pruned. Without merging
 * this is exact — the frontier holds the best NPV for every reachable capex — and it needs no
 * rounding of capex to budget units (a DP over a capex grid rounded to, say, 100 currency units
 * would either overspend or miss combinations). If the frontier grows past `maxStates`, states are
 * merged into `maxStates` capex buckets of equal width (the best NPV of each bucket survives, with
 * its real capex, so the budget is still never exceeded) and the answer is flagged inexact; with
 * the default bound this needs sites of hundreds of motors with scattered capex.
 *
 * Complexity: O(n · F · k) with n motors, F ≤ maxStates frontier states and k options per motor
 * (plus a sort of each step's F·(k+1) candidates).
 * Reference: Kellerer, Pferschy & Pisinger, Knapsack Problems, Springer 2004, ch. 11 (the
 * multiple-choice knapsack problem) and §3.4 (dynamic programming with dominance / lists of states).
 */

export interface KnapsackOption {
  /** Capital cost [currency]; a negative one (a rebate above the cost) counts as 0. */
  capex: number;
  /** Value to maximise (NPV) [currency]; options of zero or less value are never picked. */
  value: number;
}

export interface KnapsackSolution {
  /** Per item, the index of the picked option, or null. */
  picks: Array<number | null>;
  totalCapex: number;
  totalValue: number;
  /** False when the frontier had to be merged (see maxStates). */
  exact: boolean;
}

/** Default bound of the frontier [states]. */
export const MAX_FRONTIER_STATES = 20_000;

interface State {
  capex: number;
  value: number;
  item: number;
  option: number;
  previous: State | null;
}

const cents = (amount: number) => Math.round(amount * 100);

/**
 * Solves the multiple-choice knapsack.
 * @param items per item, its options
 * @param budget capital budget [currency], ≥ 0
 * @param maxStates bound of the frontier before merging [states]
 */
export function solveBudgetKnapsack(items: readonly (readonly KnapsackOption[])[], budget: number, maxStates = MAX_FRONTIER_STATES): KnapsackSolution {
  const limit = Math.floor(budget * 100 + 1e-6);
  let frontier: State[] = [{ capex: 0, value: 0, item: -1, option: -1, previous: null }];
  let exact = true;
  items.forEach((options, item) => {
    const usable = options
      .map((option, index) => ({ capex: Math.max(0, cents(option.capex)), value: cents(option.value), index }))
      .filter((option) => option.value > 0 && option.capex <= limit);
    if (usable.length === 0) return;
    const candidates: State[] = frontier.slice();
    for (const state of frontier) {
      for (const option of usable) {
        const capex = state.capex + option.capex;
        if (capex <= limit) candidates.push({ capex, value: state.value + option.value, item, option: option.index, previous: state });
      }
    }
    candidates.sort((a, b) => a.capex - b.capex || b.value - a.value);
    const pareto: State[] = [];
    let best = -Infinity;
    for (const state of candidates) {
      if (state.value > best) {
        pareto.push(state);
        best = state.value;
      }
    }
    if (pareto.length > maxStates) {
      exact = false;
      const width = (limit + 1) / maxStates;
      const merged: State[] = [];
      for (const state of pareto) {
        const last = merged[merged.length - 1];
        // In Pareto order the later state of a bucket has the higher value: it replaces the earlier.
        if (last && Math.floor(last.capex / width) === Math.floor(state.capex / width)) merged[merged.length - 1] = state;
        else merged.push(state);
      }
      frontier = merged;
    } else {
      frontier = pareto;
    }
  });
  const best = frontier[frontier.length - 1]!;
  const picks: Array<number | null> = items.map(() => null);
  for (let state: State | null = best; state && state.item >= 0; state = state.previous) picks[state.item] = state.option;
  return { picks, totalCapex: best.capex / 100, totalValue: best.value / 100, exact };
}
