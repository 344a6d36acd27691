import { it } from "vitest";
import { runPartsCorpus } from "../corpus/parts.ts";
it("p", () => { console.log("OUT", JSON.stringify(runPartsCorpus(20261204, 1000).examples)); }, 900000);
