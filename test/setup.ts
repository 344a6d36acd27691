// One seed for every fast-check property that does not name its own, so a CI run
// repeats exactly (FC_SEED=<n> explores another corner; a failure prints its seed).
import fc from "fast-check";

fc.configureGlobal({ seed: Number(process.env["FC_SEED"] ?? 20261202) });
