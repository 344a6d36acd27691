// Half of the fuzz run's random designs (fuzz/designs.ts): the specs of even
// index in designs-a, odd in designs-b, so the two files share the two cores.
import { describe } from "vitest";
import { fuzzDesigns } from "./designs.ts";

describe("fuzz: random designs through every export", () => fuzzDesigns(0, 2));
