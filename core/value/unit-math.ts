// The only part of mathjs Tickmark uses: its Unit class and the scalar arithmetic it needs, no parser or evaluator,
// built from our own unit names (dim.ts). A module of its own so the command line and the language
// server load it on first use: scripts/build.mjs makes it out/unit-math.js, beside their bundles, and most checks
// (every value one quantity or one name) never load it.
import { create, UnitDependencies, multiplyScalarDependencies, divideScalarDependencies } from 'mathjs';

export const createUnits = () => create({ UnitDependencies, multiplyScalarDependencies, divideScalarDependencies });
export type MathUnits = ReturnType<typeof createUnits>;
