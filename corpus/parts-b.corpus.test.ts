import { partsCorpusTest } from "./parts.ts";

partsCorpusTest("B", 20261205);
