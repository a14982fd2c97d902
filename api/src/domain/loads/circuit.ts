/**
 * Exact DC/resistive solution of a channel's wiring tree.
 *
 * Node 0 is the amplifier output. Every other node n hangs from `parent[n]` through a run of loop
 * resistance `edgeOhm[n]` (both conductors, ohms) and may carry a load `loadOhm[n]` (Infinity = none,
 * e.g. a junction). `isSeries[n]` says how the onward runs leaving n are wired to n's load:
 * - false (parallel/loop-through): load ‖ (onward branches in parallel);
 * - true (series string): load + (onward branches in parallel); with no onward branch the load closes
 *   the string on its own.
 * Because the return conductor of a series string carries the whole string current, adding each
 * run's full loop resistance in the branch is exact, not an approximation.
 */
export interface CircuitTree {
  /** Parent node index; −1 for node 0. */
  readonly parent: readonly number[];
  readonly edgeOhm: readonly number[];
  readonly loadOhm: readonly number[];
  readonly isSeries: readonly boolean[];
  readonly children: readonly (readonly number[])[];
  /** Every node once, each parent before its children (node 0 first). */
  readonly order: readonly number[];
}

export interface CircuitSolution {
  /** Impedance seen by the amplifier, ohms (Infinity = open circuit). */
  inputOhm: number;
  sourceVoltageV: number;
  sourceCurrentA: number;
  sourcePowerW: number;
  /** Impedance of node n and everything beyond it, at n's terminals, ohms. */
  subtreeOhm: number[];
  /** Current in the run from parent into node n, amperes (0 for node 0). */
  branchCurrentA: number[];
  /** Voltage across node n's terminals after its run, volts (the source voltage for node 0). */
  terminalVoltageV: number[];
  loadVoltageV: number[];
  loadCurrentA: number[];
  loadPowerW: number[];
  /** Power dissipated in the run into node n, watts. */
  edgePowerW: number[];
  /** Total power dissipated in all runs, watts. */
  cablePowerW: number;
}

/** Parallel combination of impedances, ohms. Infinity entries are open branches; an empty list is open. */
export function parallelOhm(values: readonly number[]): number {
  let conductance = 0;
  for (const z of values) conductance += 1 / z;
  return conductance === 0 ? Infinity : 1 / conductance;
}

/** Series combination of impedances, ohms. */
export function seriesOhm(values: readonly number[]): number {
  let sum = 0;
  for (const z of values) sum += z;
  return sum;
}

/**
 * Solves the tree driven by an ideal voltage source (0 Ω output) of `sourceVoltageV` volts rms at
 * node 0. `edgeOhm` overrides the tree's run resistances (pass zeros for the "ideal cable" case).
 * Exact (no iteration); O(nodes). Values are unrounded.
 */
export function solveCircuit(
  tree: CircuitTree,
  sourceVoltageV: number,
  edgeOhm: readonly number[] = tree.edgeOhm,
): CircuitSolution {
  const n = tree.parent.length;
  const subtreeOhm = new Array<number>(n).fill(Infinity);
  const onwardOhm = new Array<number>(n).fill(Infinity);

  for (let k = n - 1; k >= 0; k -= 1) {
    const node = tree.order[k]!;
    const kids = tree.children[node]!;
    let conductance = 0;
    for (const c of kids) conductance += 1 / (edgeOhm[c]! + subtreeOhm[c]!);
    const onward = conductance === 0 ? Infinity : 1 / conductance;
    onwardOhm[node] = onward;
    const load = tree.loadOhm[node]!;
    if (tree.isSeries[node] === true && Number.isFinite(load)) {
      subtreeOhm[node] = kids.length === 0 ? load : load + onward;
    } else {
      subtreeOhm[node] = parallelOhm([load, onward]);
    }
  }

  const branchCurrentA = new Array<number>(n).fill(0);
  const terminalVoltageV = new Array<number>(n).fill(0);
  const loadVoltageV = new Array<number>(n).fill(0);
  const loadCurrentA = new Array<number>(n).fill(0);
  const loadPowerW = new Array<number>(n).fill(0);
  const edgePowerW = new Array<number>(n).fill(0);
  /** Voltage across the parallel group of onward branches leaving each node. */
  const onwardVoltageV = new Array<number>(n).fill(0);
  let cablePowerW = 0;

  for (const node of tree.order) {
    const p = tree.parent[node]!;
    let vt: number;
    if (p < 0) {
      vt = sourceVoltageV;
      branchCurrentA[node] = 0;
    } else {
      const branch = edgeOhm[node]! + subtreeOhm[node]!;
      const i = Number.isFinite(branch) ? onwardVoltageV[p]! / branch : 0;
      branchCurrentA[node] = i;
      vt = i * subtreeOhm[node]!;
      if (!Number.isFinite(subtreeOhm[node]!)) vt = onwardVoltageV[p]!; // open end floats at the feed voltage
      edgePowerW[node] = i * i * edgeOhm[node]!;
      cablePowerW += edgePowerW[node]!;
    }
    terminalVoltageV[node] = vt;
    const load = tree.loadOhm[node]!;
    if (Number.isFinite(load)) {
      if (tree.isSeries[node] === true && p >= 0) {
        const i = branchCurrentA[node]!;
        loadCurrentA[node] = i;
        loadVoltageV[node] = i * load;
        onwardVoltageV[node] = vt - i * load;
      } else {
        loadVoltageV[node] = vt;
        loadCurrentA[node] = vt / load;
        onwardVoltageV[node] = vt;
      }
      loadPowerW[node] = loadVoltageV[node]! * loadCurrentA[node]!;
    } else {
      onwardVoltageV[node] = vt;
    }
  }

  const root = tree.order[0] ?? 0;
  const inputOhm = tree.children[root]!.length === 0 ? Infinity : onwardOhm[root]!;
  const sourceCurrentA = Number.isFinite(inputOhm) ? sourceVoltageV / inputOhm : 0;
  return {
    inputOhm,
    sourceVoltageV,
    sourceCurrentA,
    sourcePowerW: sourceVoltageV * sourceCurrentA,
    subtreeOhm,
    branchCurrentA,
    terminalVoltageV,
    loadVoltageV,
    loadCurrentA,
    loadPowerW,
    edgePowerW,
    cablePowerW,
  };
}

/** Mutable builder for a {@link CircuitTree}; node 0 (the source) exists from the start. */
export class CircuitTreeBuilder {
  readonly parent: number[] = [-1];
  readonly edgeOhm: number[] = [0];
  readonly loadOhm: number[] = [Infinity];
  readonly isSeries: boolean[] = [false];
  readonly children: number[][] = [[]];
  readonly order: number[] = [0];

  /** Adds a node under `parent` (which must already exist) and returns its index. */
  add(parent: number, edgeOhm: number, loadOhm: number, isSeries = false): number {
    const index = this.parent.length;
    this.parent.push(parent);
    this.edgeOhm.push(edgeOhm);
    this.loadOhm.push(loadOhm);
    this.isSeries.push(isSeries);
    this.children.push([]);
    this.children[parent]!.push(index);
    this.order.push(index);
    return index;
  }

  build(): CircuitTree {
    return this;
  }
}
