import { stabilityCorpusTest } from "./stability.ts";

stabilityCorpusTest("A", 20261202);
