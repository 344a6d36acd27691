/**
 * The check that a drawn schematic is the circuit: the nets its wires make
 * (a wire's end or a pin lying anywhere on another wire joins it; wires that
 * only cross do not join; every ground symbol is one net) compared with the
 * stage's element list, so that every part and op-amp pin sits on the net of
 * the node the element list names, each node is one net, and every element is
 * drawn once. A layout or template that fails the check is not used.
 *
 * @module
 */
import type { Element } from "../../circuit/types.ts";
import { opampPins, type Point, type Sheet } from "./sheet.ts";

const key = (p: Point): string => `${p[0]},${p[1]}`;

/** Union-find over point keys. */
function nets(sheet: Sheet, pins: readonly Point[]): (p: Point) => string {
  const parent = new Map<string, string>();
  const find = (k: string): string => {
    let r = k;
    while ((parent.get(r) ?? r) !== r) r = parent.get(r) as string;
    parent.set(k, r);
    return r;
  };
  const union = (a: string, b: string): void => {
    const ra = find(a);
    const rb = find(b);
    if (ra !== rb) parent.set(ra, rb);
  };
  const points = [...pins, ...sheet.wires.flat()];
  for (const w of sheet.wires) {
    for (let i = 1; i < w.length; i++) {
      const [ax, ay] = w[i - 1] as Point;
      const [bx, by] = w[i] as Point;
      for (const p of points) {
        const onX = ax === bx && p[0] === ax && p[1] >= Math.min(ay, by) && p[1] <= Math.max(ay, by);
        const onY = ay === by && p[1] === ay && p[0] >= Math.min(ax, bx) && p[0] <= Math.max(ax, bx);
        if (onX || onY) union(key(p), key(w[0] as Point));
      }
    }
  }
  const first = sheet.grounds[0];
  if (first !== undefined) for (const g of sheet.grounds) union(key(g), key(first));
  return (p) => find(key(p));
}

/**
 * Whether a sheet draws exactly the given elements (see the module header).
 *
 * @param sheet - the drawing
 * @param elements - the stage's elements, nodes named as in its topology (`in`, `out`, `0`, internal names)
 * @returns null when it does, else what is wrong
 */
export function sheetMismatch(sheet: Sheet, elements: readonly Element[]): string | null {
  for (const w of sheet.wires) {
    for (let i = 1; i < w.length; i++) {
      const a = w[i - 1] as Point;
      const b = w[i] as Point;
      if (a[0] !== b[0] && a[1] !== b[1]) return `a wire runs diagonally from ${key(a)} to ${key(b)}`;
    }
  }
  const pins: Point[] = [
    ...sheet.parts.flatMap((p) => [p.a, p.b]),
    ...sheet.opamps.flatMap((o) => Object.values(opampPins(o))),
    ...sheet.grounds,
    ...sheet.terminals.map((t) => t.at),
  ];
  const net = nets(sheet, pins);
  const nodeOf = new Map<string, string>();
  const netOf = new Map<string, string>();
  const bind = (n: string, node: string, what: string): string | null => {
    const had = nodeOf.get(n);
    if (had !== undefined && had !== node) return `${what} is drawn on the net of node ${had}, not ${node}`;
    const other = netOf.get(node);
    if (other !== undefined && other !== n) return `node ${node} is drawn as two separate nets (${what})`;
    nodeOf.set(n, node);
    netOf.set(node, n);
    return null;
  };
  const checks: (() => string | null)[] = [];
  for (const g of sheet.grounds) checks.push(() => bind(net(g), "0", "a ground symbol"));
  for (const t of sheet.terminals) checks.push(() => bind(net(t.at), t.node, `terminal ${t.node}`));
  const drawnParts = new Map(sheet.parts.map((p) => [p.name, p]));
  const drawnOpamps = new Map(sheet.opamps.map((o) => [o.name, o]));
  if (drawnParts.size !== sheet.parts.length || drawnOpamps.size !== sheet.opamps.length) return "an element is drawn twice";
  const twoTerminal: { name: string; a: string; b: string; pa: Point; pb: Point }[] = [];
  let count = 0;
  for (const e of elements) {
    if (e.kind === "V" || e.kind === "E") continue;
    count++;
    if (e.kind === "OA") {
      const o = drawnOpamps.get(e.name);
      if (o === undefined) return `op-amp ${e.name} is not drawn`;
      const p = opampPins(o);
      checks.push(() => bind(net(p.plus), e.inP, `${e.name}'s + input`), () => bind(net(p.minus), e.inN, `${e.name}'s - input`), () => bind(net(p.out), e.out, `${e.name}'s output`));
      continue;
    }
    const p = drawnParts.get(e.name);
    if (p === undefined || p.kind !== e.kind) return `${e.name} is not drawn`;
    twoTerminal.push({ name: e.name, a: e.a, b: e.b, pa: p.a, pb: p.b });
  }
  if (count !== sheet.parts.length + sheet.opamps.length) return "the drawing has elements the stage does not";
  for (const c of checks) {
    const bad = c();
    if (bad !== null) return bad;
  }
  // a part's two ends may be drawn either way round: settle the ones a known net decides first
  let pending = twoTerminal;
  while (pending.length > 0) {
    const decided = pending.filter((t) => nodeOf.has(net(t.pa)) || nodeOf.has(net(t.pb)));
    const next = decided.length > 0 ? decided : [pending[0] as (typeof pending)[number]];
    for (const t of next) {
      const swap = nodeOf.get(net(t.pa)) === t.b || nodeOf.get(net(t.pb)) === t.a;
      const bad = bind(net(t.pa), swap ? t.b : t.a, `${t.name}`) ?? bind(net(t.pb), swap ? t.a : t.b, `${t.name}`);
      if (bad !== null) return bad;
    }
    pending = pending.filter((t) => !next.includes(t));
  }
  return null;
}
