// Sessions given as lists of the species they found must give exactly what the same
// sessions give as a unit × species grid: the results page sends lists, the checks
// against R vegan (vegan-incidence.test.ts) use grids.

import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { DiversityInputError } from "./errors";
import { diversityResults } from "./results";

const gridArb = fc.tuple(fc.integer({ min: 1, max: 12 }), fc.integer({ min: 1, max: 16 })).chain(([T, S]) =>
  fc.array(
    fc.array(fc.oneof(fc.constant(0), fc.constant(0), fc.integer({ min: 1, max: 5 })), {
      minLength: S,
      maxLength: S,
    }),
    { minLength: T, maxLength: T },
  ),
);

const listsOf = (grid: number[][]): number[][] => grid.map((row) => row.flatMap((v, s) => (v > 0 ? [s] : [])));
const sums = (grid: number[][]): number[] => grid[0]!.map((_, s) => grid.reduce((n, row) => n + row[s]!, 0));

describe("diversityResults with unitLists", () => {
  it("gives the same incidence statistics and accumulation curve as the grid", () => {
    fc.assert(
      fc.property(gridArb, (grid) => {
        const counts = sums(grid);
        const fromGrid = diversityResults({ counts, units: grid, curvePoints: 12 });
        const fromLists = diversityResults({ counts, unitLists: listsOf(grid), curvePoints: 12 });
        expect(fromLists.incidence).toEqual(fromGrid.incidence);
        expect(fromLists.accumulationCurve).toEqual(fromGrid.accumulationCurve);
        expect(fromLists.abundance).toEqual(fromGrid.abundance);
      }),
      { numRuns: 200 },
    );
  });

  it("counts a species listed twice in one session once", () => {
    const counts = [3, 2, 1];
    const once = diversityResults({ counts, unitLists: [[0, 1], [0], [2]] });
    const twice = diversityResults({ counts, unitLists: [[0, 1, 0], [0], [2, 2]] });
    expect(twice.incidence).toEqual(once.incidence);
    expect(once.incidence!.incidences).toBe(4);
  });

  it("refuses an index outside the species, naming where it is, and lists without counts", () => {
    expect(() => diversityResults({ counts: [1, 1], unitLists: [[0], [2]] })).toThrow(DiversityInputError);
    expect(() => diversityResults({ counts: [1, 1], unitLists: [[0], [2]] })).toThrow(/lists\[1\]\[0\]/);
    expect(() => diversityResults({ unitLists: [[0]] })).toThrow(DiversityInputError);
    expect(() => diversityResults({ counts: [1], units: [[1]], unitLists: [[0]] })).toThrow(DiversityInputError);
  });
});
