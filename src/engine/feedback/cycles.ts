// Graph routines for loop discovery on a directed graph given as adjacency lists (vertex ids
// 0..count-1): strongly connected components (Tarjan 1972) and elementary cycles (Johnson 1975).

/** Strongly connected components, each a sorted vertex list; `of[v]` is v's component index.
 *  Components come out in reverse topological order (Tarjan 1972), iteratively (no deep recursion). */
export function stronglyConnected(count: number, adj: number[][]): { components: number[][]; of: Int32Array } {
  const index = new Int32Array(count).fill(-1);
  const low = new Int32Array(count);
  const onStack = new Uint8Array(count);
  const of = new Int32Array(count).fill(-1);
  const stack: number[] = [];
  const components: number[][] = [];
  let next = 0;
  for (let root = 0; root < count; root++) {
    if (index[root] >= 0) continue;
    // explicit DFS frames: [vertex, next neighbour position]
    const frames: [number, number][] = [[root, 0]];
    index[root] = low[root] = next++;
    stack.push(root);
    onStack[root] = 1;
    while (frames.length) {
      const top = frames[frames.length - 1];
      const v = top[0];
      if (top[1] < adj[v].length) {
        const w = adj[v][top[1]++];
        if (index[w] < 0) {
          index[w] = low[w] = next++;
          stack.push(w);
          onStack[w] = 1;
          frames.push([w, 0]);
        } else if (onStack[w]) {
          low[v] = Math.min(low[v], index[w]);
        }
        continue;
      }
      frames.pop();
      if (frames.length) {
        const parent = frames[frames.length - 1][0];
        low[parent] = Math.min(low[parent], low[v]);
      }
      if (low[v] === index[v]) {
        const comp: number[] = [];
        let w: number;
        do {
          w = stack.pop()!;
          onStack[w] = 0;
          of[w] = components.length;
          comp.push(w);
        } while (w !== v);
        components.push(comp.sort((a, b) => a - b));
      }
    }
  }
  return { components, of };
}

export interface CycleEnumeration {
  /** Each cycle as its vertex sequence, starting at its smallest vertex; edges run v[i] → v[i+1]
   *  and last → first. A self-loop is a one-vertex cycle. */
  cycles: number[][];
  /** True when more than `maxCycles` cycles exist and the enumeration stopped. */
  truncated: boolean;
}

/** Elementary cycles by Johnson's algorithm (Johnson 1975): for each start s, search the strong
 *  component of s in the subgraph of vertices ≥ s with the blocked-set bookkeeping that makes the
 *  search time linear per cycle found. Stops after `maxCycles`. Neighbour order is respected (except
 *  that the edge closing the cycle comes first), so a caller that sorts neighbours by coupling size
 *  finds the large cycles first. */
export function elementaryCycles(count: number, adj: number[][], maxCycles = 10000): CycleEnumeration {
  const cycles: number[][] = [];
  const blocked = new Uint8Array(count);
  const blockMap: Set<number>[] = Array.from({ length: count }, () => new Set<number>());
  const path: number[] = [];
  let truncated = false;

  const unblock = (u: number) => {
    const work = [u];
    while (work.length) {
      const x = work.pop()!;
      if (!blocked[x]) continue;
      blocked[x] = 0;
      for (const w of blockMap[x]) work.push(w);
      blockMap[x].clear();
    }
  };

  for (let s = 0; s < count && !truncated; s++) {
    // subgraph on vertices ≥ s, restricted to the strong component that holds s
    // the edge back to s is tried first at every vertex: a cycle is reported as soon as the path can
    // close, so with a budget the strongest-first path yields its own cycle (e.g. a loop through a
    // whole chain) before the many cycles that wander on from its far end
    const sub = adj.map((list, v) => (v < s ? [] : list.filter((w) => w >= s)));
    for (const list of sub) {
      const at = list.indexOf(s);
      if (at > 0) { list.splice(at, 1); list.unshift(s); }
    }
    const { of } = stronglyConnected(count, sub);
    const inComp = (v: number) => v >= s && of[v] === of[s];
    if (!sub[s].some((w) => inComp(w))) continue;
    for (let v = s; v < count; v++) { blocked[v] = 0; blockMap[v].clear(); }

    // circuit(v) of Johnson 1975, with an explicit stack of [vertex, neighbour position, found]
    const frames: { v: number; i: number; found: boolean }[] = [{ v: s, i: 0, found: false }];
    path.push(s);
    blocked[s] = 1;
    while (frames.length && !truncated) {
      const fr = frames[frames.length - 1];
      const nbrs = sub[fr.v];
      if (fr.i < nbrs.length) {
        const w = nbrs[fr.i++];
        if (!inComp(w)) continue;
        if (w === s) {
          if (cycles.length >= maxCycles) { truncated = true; break; }
          cycles.push(path.slice());
          fr.found = true;
        } else if (!blocked[w]) {
          path.push(w);
          blocked[w] = 1;
          frames.push({ v: w, i: 0, found: false });
        }
        continue;
      }
      frames.pop();
      path.pop();
      if (fr.found) {
        unblock(fr.v);
      } else {
        for (const w of nbrs) if (inComp(w)) blockMap[w].add(fr.v);
      }
      if (frames.length && fr.found) frames[frames.length - 1].found = true;
    }
    path.length = 0;
  }
  return { cycles, truncated };
}

/** Every elementary cycle of at most `maxLen` vertices (no self-loops), each starting at its smallest
 *  vertex, by depth-limited search; stops after `maxCycles`. Johnson's search can spend its whole
 *  budget on long cycles through the first vertex of a dense graph; the short loops are the ones a
 *  designer reads first, so they are found this way before it. `keep` may refuse cycles (they
 *  still count against `maxCycles`). */
export function shortCycles(count: number, adj: number[][], maxLen: number, maxCycles = 10000, keep?: (path: number[]) => boolean): CycleEnumeration {
  const cycles: number[][] = [];
  const path: number[] = [];
  const onPath = new Uint8Array(count);
  let truncated = false;
  let found = 0;
  // at full length only the edge back to the start can close a cycle: looked up, not searched for
  const closes = new Uint8Array(count * count);
  for (let v = 0; v < count; v++) for (const w of adj[v]) closes[v * count + w] = 1;
  const walk = (s: number, v: number): void => {
    if (path.length >= maxLen && path.length >= 2) {
      if (!closes[v * count + s]) return;
      if (found >= maxCycles) { truncated = true; return; }
      found++;
      if (!keep || keep(path)) cycles.push(path.slice());
      return;
    }
    const next = adj[v];
    for (let t = 0; t < next.length; t++) {
      const w = next[t];
      if (truncated) return;
      if (w === s && path.length >= 2) {
        if (found >= maxCycles) { truncated = true; return; }
        found++;
        // `keep`: the caller's test on the cycle as found (path in order); cycles it refuses are
        // counted against maxCycles but not listed
        if (!keep || keep(path)) cycles.push(path.slice());
      } else if (w > s && !onPath[w] && path.length < maxLen) {
        path.push(w); onPath[w] = 1;
        walk(s, w);
        path.pop(); onPath[w] = 0;
      }
    }
  };
  for (let s = 0; s < count && !truncated; s++) {
    path.push(s); onPath[s] = 1;
    walk(s, s);
    path.pop(); onPath[s] = 0;
  }
  return { cycles, truncated };
}
