/**
 * The memory a thread's answer can hand over instead of copying: the
 * ArrayBuffer behind every typed array in a value of plain objects and
 * arrays, each once (views may share one). Posted with them as the transfer
 * list (Node's worker_threads, the HTML structured clone algorithm), the
 * bytes move to the receiving thread and the sender's views are left empty,
 * so a sender that is done with its answer never holds it twice.
 */
export function transferablesOf(value: unknown): ArrayBuffer[] {
  const found = new Set<ArrayBuffer>();
  const seen = new Set<object>();
  const visit = (item: unknown): void => {
    if (item === null || typeof item !== 'object' || seen.has(item)) return;
    seen.add(item);
    if (ArrayBuffer.isView(item)) {
      if (item.buffer instanceof ArrayBuffer) found.add(item.buffer);
      return;
    }
    for (const field of Array.isArray(item) ? item : Object.values(item)) visit(field);
  };
  visit(value);
  return [...found];
}
