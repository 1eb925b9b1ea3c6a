/**
 * Generates references for sales entered without one: `S-0001`, `S-0002`, … continuing
 * after the highest such number already in the market and skipping any taken reference.
 */
const GENERATED = /^S-(\d+)$/;

export function refGenerator(taken: Iterable<string>): () => string {
  const used = new Set(taken);
  let next = 1;
  for (const ref of used) {
    const m = GENERATED.exec(ref);
    if (m) next = Math.max(next, Number(m[1]) + 1);
  }
  return () => {
    let ref: string;
    do ref = `S-${String(next++).padStart(4, '0')}`;
    while (used.has(ref));
    used.add(ref);
    return ref;
  };
}
