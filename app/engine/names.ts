/**
 * The one name people see for each outlet and eaves edge: "O1" (as on the plan and in every
 * table), "outlet O1" in a sentence; "eaves edge 3". Internal drain ids ("outlet-0", "eaves-2")
 * stay in the data and never reach a message.
 */
export const outletName = (index: number) => `O${index + 1}`;

/** "outlet O1" for "outlet-0", "eaves edge 3" for "eaves-2"; anything else as it is. */
export function drainName(drain: string): string {
  const m = /^(outlet|eaves)-(\d+)$/.exec(drain);
  if (!m) return drain;
  const n = Number(m[2]);
  return m[1] === "outlet" ? `outlet ${outletName(n)}` : `eaves edge ${n + 1}`;
}
