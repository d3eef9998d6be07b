/** Cycle finding on small directed graphs (steps, or settings that name each other). */

/** Strongly connected components (Tarjan), keeping only those that contain a cycle. */
export function cyclicComponents(nodes: string[], edges: Map<string, Set<string>>): string[][] {
  let counter = 0;
  const index = new Map<string, number>();
  const low = new Map<string, number>();
  const stack: string[] = [];
  const onStack = new Set<string>();
  const result: string[][] = [];
  const connect = (v: string): void => {
    index.set(v, counter);
    low.set(v, counter);
    counter++;
    stack.push(v);
    onStack.add(v);
    for (const w of edges.get(v) ?? []) {
      if (!index.has(w)) {
        connect(w);
        low.set(v, Math.min(low.get(v)!, low.get(w)!));
      } else if (onStack.has(w)) {
        low.set(v, Math.min(low.get(v)!, index.get(w)!));
      }
    }
    if (low.get(v) === index.get(v)) {
      const component: string[] = [];
      let w: string;
      do {
        w = stack.pop()!;
        onStack.delete(w);
        component.push(w);
      } while (w !== v);
      const selfLoop = edges.get(v)?.has(v) ?? false;
      if (component.length > 1 || selfLoop) result.push(component);
    }
  };
  for (const v of nodes) if (!index.has(v)) connect(v);
  return result;
}

/** One concrete cycle through the component, in order, for the message: "a → b → a". */
export function cyclePath(component: string[], edges: Map<string, Set<string>>, order: string[]): string[] {
  const members = new Set(component);
  const start = order.find((s) => members.has(s))!;
  const previous = new Map<string, string>();
  const queue = [start];
  const seen = new Set<string>();
  while (queue.length > 0) {
    const v = queue.shift()!;
    for (const w of edges.get(v) ?? []) {
      if (!members.has(w)) continue;
      if (w === start) {
        const path = [v];
        while (path[0] !== start) path.unshift(previous.get(path[0])!);
        return [...path, start];
      }
      if (!seen.has(w)) {
        seen.add(w);
        previous.set(w, v);
        queue.push(w);
      }
    }
  }
  return [start, start];
}
