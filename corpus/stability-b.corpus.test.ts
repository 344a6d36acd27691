import { stabilityCorpusTest } from "./stability.ts";

stabilityCorpusTest("B", 20261203);
