import { partsCorpusTest } from "./parts.ts";

partsCorpusTest("A", 20261204);
