import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { formatSectionTable, sectionTable } from "../../src/approx/section-table.ts";
import { butterworth } from "../../src/approx/butterworth.ts";
import { bessel } from "../../src/approx/bessel.ts";
import { chebyshev1 } from "../../src/approx/chebyshev1.ts";
import { chebyshev2 } from "../../src/approx/chebyshev2.ts";
import { elliptic } from "../../src/approx/elliptic.ts";
import { rescaleToAttenuation } from "../../src/approx/prototype.ts";
import { InvalidArgumentError } from "../../src/errors.ts";
import type { Zpk } from "../../src/tf/types.ts";
import { loadFixture } from "../helpers/fixtures.ts";
import { expectClose } from "../helpers/tolerance.ts";

interface HandbookFile {
  precision: { a: number; b: number; q: number };
  tables: {
    family: "butterworth" | "bessel" | "chebyshev1";
    rippleDb: number | null;
    title: string;
    rows: { order: number; sections: { a: number; b: number; q: number | null }[] }[];
  }[];
}

const DB3 = 10 * Math.log10(2);

/** The handbook's normalisation: -3 dB below the DC gain at 1 rad/s. */
function handbookPrototype(family: string, order: number, rippleDb: number | null): Zpk {
  if (family === "butterworth") return butterworth(order);
  if (family === "bessel") return bessel(order, { normalization: "magnitude" });
  const rp = rippleDb as number;
  const dcLoss = order % 2 === 0 ? rp : 0;
  return rescaleToAttenuation(chebyshev1(order, { rippleDb: rp }), { attenuationDb: DB3 + dcLoss });
}

describe("sectionTable", () => {
  it("reproduces the handbook tables (Tietze & Schenk, from memory) of Butterworth, Bessel, Chebyshev 0.5 and 1 dB, orders 2-10, to the printed digits", () => {
    const fx = loadFixture<HandbookFile>("approx-handbook-tables.json");
    let checked = 0;
    for (const t of fx.tables) {
      expect(t.rows.length).toBeGreaterThanOrEqual(8);
      for (const row of t.rows) {
        const rows = sectionTable(handbookPrototype(t.family, row.order, t.rippleDb));
        expect(rows.length, `${t.title} n=${row.order}`).toBe(row.sections.length);
        row.sections.forEach((sec, i) => {
          const r = rows[i] as (typeof rows)[number];
          const label = `${t.title} n=${row.order} section ${i + 1}`;
          if (sec.b === 0) {
            expect(r.order, label).toBe(1);
            // first order: 1 / (1 + a S), a = 1 / w0
            expect(Math.abs(1 / r.w0 - sec.a), label).toBeLessThanOrEqual(0.5e-4 + 1e-9);
          } else {
            expect(r.order, label).toBe(2);
            const q = r.q as number;
            // 1 / (1 + a S + b S^2): b = 1 / w0^2, a = 1 / (Q w0)
            expect(Math.abs(1 / r.w0 ** 2 - sec.b), `${label} b`).toBeLessThanOrEqual(0.5e-4 + 1e-9);
            expect(Math.abs(1 / (q * r.w0) - sec.a), `${label} a`).toBeLessThanOrEqual(0.5e-4 + 1e-9);
            expect(Math.abs(q - (sec.q as number)), `${label} Q`).toBeLessThanOrEqual(0.005 + 1e-9);
          }
          checked++;
        });
      }
    }
    expect(checked).toBeGreaterThan(100);
  });

  it("lists the first-order row first, then rising Q; w0 and Q agree with the poles", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 24 }), fc.double({ min: 0.1, max: 3, noNaN: true }), (n, rp) => {
        const h = chebyshev1(n, { rippleDb: rp });
        const rows = sectionTable(h);
        expect(rows.length).toBe(Math.ceil(n / 2));
        if (n % 2 === 1) expect((rows[0] as (typeof rows)[number]).order).toBe(1);
        let prevQ = 0;
        rows.forEach((r, i) => {
          expect(r.index).toBe(i + 1);
          expect(r.kind).toBe("lowpass");
          if (r.order === 2) {
            expect(r.q as number).toBeGreaterThanOrEqual(prevQ);
            prevQ = r.q as number;
          }
        });
        // Highest-Q pole pair of a Chebyshev I: theta = pi/(2n)
        if (n >= 2) {
          const top = rows[rows.length - 1] as (typeof rows)[number];
          const p = h.poles.reduce((a, b) => (Math.abs(b.im) > Math.abs(a.im) ? b : a));
          expectClose(top.w0, Math.hypot(p.re, p.im), { rel: 1e-12 });
          expectClose(top.q as number, Math.hypot(p.re, p.im) / (2 * -p.re), { rel: 1e-12 });
        }
      }),
      { numRuns: 40 },
    );
  });

  it("gives notch rows with the zero frequency for Chebyshev II and elliptic prototypes", () => {
    const h = elliptic(5, { rippleDb: 0.5, attenuationDb: 60 });
    const rows = sectionTable(h);
    expect(rows.map((r) => r.kind)).toEqual(["lowpass", "notch", "notch"]);
    const wz = rows.filter((r) => r.wz !== undefined).map((r) => r.wz as number);
    const zeroW = h.zeros.filter((z) => z.im > 0).map((z) => z.im);
    expect([...wz].sort()).toEqual([...zeroW].sort());
    // the highest-Q pair takes the zero nearest the band edge
    expectClose((rows[2] as (typeof rows)[number]).wz as number, Math.min(...zeroW), { rel: 1e-12 });
    for (const r of sectionTable(chebyshev2(6, { attenuationDb: 40 }))) {
      expect(r.kind).toBe("notch");
      expect(r.notchType).toBe("lowpass-notch");
    }
    const desc = sectionTable(h, { order: "descending-q" });
    expect(desc.map((r) => r.q ?? 0)).toEqual([...rows].reverse().map((r) => r.q ?? 0));
  });

  it("rejects unstable or improper systems and unknown orderings", () => {
    expect(() => sectionTable({ zeros: [], poles: [{ re: 1, im: 0 }], gain: 1 })).toThrow(/zpk\.poles\.0/);
    expect(() => sectionTable({ zeros: [{ re: -1, im: 0 }, { re: -2, im: 0 }], poles: [{ re: -1, im: 0 }], gain: 1 })).toThrow(
      InvalidArgumentError,
    );
    expect(() => sectionTable(butterworth(3), { order: "by-w0" as "as-given" })).toThrow(/options\.order/);
  });
});

describe("formatSectionTable", () => {
  it("renders a fixed-width table with '-' for missing values", () => {
    expect(formatSectionTable(sectionTable(butterworth(3)))).toBe(
      "#  order  w0 (rad/s)  Q      wz (rad/s)  kind\n" + "1  1      1.000       -      -           lowpass\n" + "2  2      1.000       1.000  -           lowpass\n",
    );
    const text = formatSectionTable(sectionTable(elliptic(4, { rippleDb: 1, attenuationDb: 40 })), { digits: 6 });
    const lines = text.trimEnd().split("\n");
    expect(lines.length).toBe(3);
    expect(lines[1]).toMatch(/notch \(lowpass-notch\)$/);
    // columns line up: "kind" starts at the same offset on every line
    const offsets = lines.map((l) => l.search(/(kind|notch|lowpass)/));
    expect(new Set(offsets).size).toBe(1);
  });

  it("rejects bad digits and non-arrays", () => {
    expect(() => formatSectionTable(sectionTable(butterworth(2)), { digits: 0 })).toThrow(/options\.digits/);
    expect(() => formatSectionTable("rows" as unknown as [])).toThrow(/rows/);
  });
});
