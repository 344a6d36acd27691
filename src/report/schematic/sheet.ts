/**
 * A schematic as placed symbols and wires on a grid: two-terminal parts
 * between two grid points, op-amps by their input edge, wires as axis-aligned
 * polylines, ground symbols and the stage's input and output terminals. The
 * layouts (src/report/schematic/generic.ts and the per-topology templates)
 * build one; src/report/schematic/connectivity.ts checks it against the
 * stage's element list; src/report/schematic/render.ts draws it.
 *
 * Grid coordinates are whole numbers; one unit is {@link GRID} pixels.
 *
 * @module
 */

/** Pixels per grid unit. */
export const GRID = 10;

/** A grid point `[x, y]` (y grows downward, as in SVG). */
export type Point = readonly [number, number];

/** Where a part's two labels go. */
export type LabelSide = "left" | "right" | "above" | "below";

/** A resistor, capacitor or inductor drawn between two grid points on one line. */
export interface PlacedPart {
  /** Kind. */
  readonly kind: "R" | "C" | "L";
  /** Designator on the board. */
  readonly name: string;
  /** Value, SI. */
  readonly value: number;
  /** One end. */
  readonly a: Point;
  /** The other end (same x or same y as `a`). */
  readonly b: Point;
  /** Where the designator and value are written. */
  readonly label: LabelSide;
}

/** An op-amp: a triangle pointing right with its inputs on the left edge. */
export interface PlacedOpamp {
  /** Designator on the board. */
  readonly name: string;
  /** The middle of the input edge's pins: inputs at y - 2 and y + 2, x - 1; output at x + 7, y. */
  readonly at: Point;
  /** Whether the non-inverting input is the upper one. */
  readonly plusOnTop: boolean;
}

/** A terminal of the stage (an open circle with its name). */
export interface PlacedTerminal {
  /** `"in"` or `"out"`. */
  readonly node: "in" | "out";
  /** Where. */
  readonly at: Point;
  /** Which side of the circle the name goes. */
  readonly side: "left" | "right";
}

/** A whole schematic. */
export interface Sheet {
  /** Two-terminal parts. */
  readonly parts: readonly PlacedPart[];
  /** Op-amps. */
  readonly opamps: readonly PlacedOpamp[];
  /** Wires, each an axis-aligned polyline. */
  readonly wires: readonly (readonly Point[])[];
  /** Ground symbols, by the point they connect at. */
  readonly grounds: readonly Point[];
  /** Input and output terminals. */
  readonly terminals: readonly PlacedTerminal[];
  /** Node names written beside a point (internal nodes of the generic layout). */
  readonly nodeLabels: readonly { readonly text: string; readonly at: Point }[];
}

/** The pins of an op-amp, grid points. */
export function opampPins(o: PlacedOpamp): { readonly plus: Point; readonly minus: Point; readonly out: Point } {
  const [x, y] = o.at;
  const top: Point = [x - 1, y - 2];
  const bottom: Point = [x - 1, y + 2];
  return { plus: o.plusOnTop ? top : bottom, minus: o.plusOnTop ? bottom : top, out: [x + 7, y] };
}

/** A sheet under construction (the templates' and layouts' scratch pad). */
export interface SheetBuilder {
  /** Place a part between two points. */
  part(kind: "R" | "C" | "L", name: string, value: number, a: Point, b: Point, label?: LabelSide): void;
  /** Place an op-amp; returns its pins. */
  opamp(name: string, at: Point, plusOnTop: boolean): ReturnType<typeof opampPins>;
  /** A wire through the points. */
  wire(...points: Point[]): void;
  /** A ground symbol at the point. */
  ground(at: Point): void;
  /** A terminal. */
  terminal(node: "in" | "out", at: Point, side: "left" | "right"): void;
  /** A node name beside a point. */
  nodeLabel(text: string, at: Point): void;
  /** The finished sheet. */
  done(): Sheet;
}

/**
 * Start a sheet.
 *
 * @returns the builder
 */
export function sheetBuilder(): SheetBuilder {
  const parts: PlacedPart[] = [];
  const opamps: PlacedOpamp[] = [];
  const wires: Point[][] = [];
  const grounds: Point[] = [];
  const terminals: PlacedTerminal[] = [];
  const nodeLabels: { text: string; at: Point }[] = [];
  return {
    part(kind, name, value, a, b, label) {
      parts.push({ kind, name, value, a, b, label: label ?? (a[1] === b[1] ? "above" : "right") });
    },
    opamp(name, at, plusOnTop) {
      const o = { name, at, plusOnTop };
      opamps.push(o);
      return opampPins(o);
    },
    wire(...points) {
      if (points.length >= 2) wires.push(points);
    },
    ground(at) {
      grounds.push(at);
    },
    terminal(node, at, side) {
      terminals.push({ node, at, side });
    },
    nodeLabel(text, at) {
      nodeLabels.push({ text, at });
    },
    done() {
      return { parts, opamps, wires, grounds, terminals, nodeLabels };
    },
  };
}
