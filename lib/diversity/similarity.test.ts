// Zone similarity (Chao et al. 2005) and multiplicative beta diversity (Jost 2007):
// hand-computed cases and properties.

import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { DiversityInputError, hillBeta, zoneSimilarity, zoneSimilarityIncidence } from "./index";

describe("zoneSimilarity (abundance), hand-computed", () => {
  it("A = [5, 3, 1, 1, 0], B = [4, 0, 1, 2, 1]", () => {
    // Shared: species 1, 3, 4 (1-based). Classic Sørensen 2·3/(2·3 + 1 + 1) = 0.75, Jaccard 3/5.
    // Ũ = 7/10; f+1 = 1 (species 3 seen once in B), f+2 = 1; Û = 0.7 + (7/8)(1/2)(1/10) = 0.74375.
    // Ṽ = 7/8; f1+ = 2, f2+ = 0 → 1; V̂ = 0.875 + (9/10)(2/2)(3/8) = 1.2125, truncated to 1.
    const s = zoneSimilarity([5, 3, 1, 1, 0], [4, 0, 1, 2, 1]);
    expect(s.shared).toBe(3);
    expect(s.sorensen).toBeCloseTo(0.75, 12);
    expect(s.jaccard).toBeCloseTo(0.6, 12);
    expect(s.uHat).toBeCloseTo(0.74375, 12);
    expect(s.vHat).toBe(1);
    expect(s.jaccardAdjusted).toBeCloseTo(0.74375, 12);
    expect(s.sorensenAdjusted).toBeCloseTo((2 * 0.74375) / 1.74375, 12);
  });

  it("identical zones give 1, disjoint zones 0, an empty zone 0", () => {
    const a = [12, 5, 1, 1, 2, 0];
    const s = zoneSimilarity(a, a);
    expect([s.sorensen, s.jaccard, s.sorensenAdjusted, s.jaccardAdjusted]).toEqual([1, 1, 1, 1]);
    const d = zoneSimilarity([3, 0, 1], [0, 2, 0]);
    expect([d.shared, d.sorensen, d.jaccard, d.sorensenAdjusted, d.jaccardAdjusted]).toEqual([0, 0, 0, 0, 0]);
    expect(zoneSimilarity([0, 0], [1, 2]).jaccardAdjusted).toBe(0);
  });

  it("refuses misaligned zones", () => {
    expect(() => zoneSimilarity([1, 2], [1])).toThrow(DiversityInputError);
    expect(() => zoneSimilarity([1, -2], [1, 1])).toThrow(DiversityInputError);
  });
});

describe("zoneSimilarityIncidence, hand-computed", () => {
  it("zone A: 3 units (one empty), zone B: 2 units", () => {
    // Y_A = (2, 1, 0), U_A = 3, T_A = 3; Y_B = (1, 1, 1), U_B = 3, T_B = 2. Shared: species 1, 2.
    // Û = 3/3 = 1 (already complete). Ṽ = 2/3; f1+ = 1 (species 2), f2+ = 1 (species 1);
    // V̂ = 2/3 + ((3−1)/3)(1/2)(1/3) = 7/9. Jaccard 7/9, Sørensen 2(7/9)/(16/9) = 7/8.
    const s = zoneSimilarityIncidence(
      [
        [1, 1, 0],
        [1, 0, 0],
        [0, 0, 0],
      ],
      [
        [1, 0, 1],
        [0, 1, 0],
      ],
    );
    expect(s.shared).toBe(2);
    expect(s.sorensen).toBeCloseTo(0.8, 12);
    expect(s.jaccard).toBeCloseTo(2 / 3, 12);
    expect(s.vHat).toBeCloseTo(7 / 9, 12);
    expect(s.jaccardAdjusted).toBeCloseTo(7 / 9, 12);
    expect(s.sorensenAdjusted).toBeCloseTo(7 / 8, 12);
  });
});

describe("hillBeta (Jost 2007, zones weighted equally)", () => {
  it("identical zones: beta 1; zones with no species in common: beta = number of zones", () => {
    for (const q of [0, 0.5, 1, 2]) {
      expect(
        hillBeta(
          [
            [4, 2, 1],
            [4, 2, 1],
          ],
          q,
        ).beta,
      ).toBeCloseTo(1, 12);
      expect(
        hillBeta(
          [
            [4, 2, 0, 0, 0],
            [0, 0, 3, 3, 0],
            [0, 0, 0, 0, 9],
          ],
          q,
        ).beta,
      ).toBeCloseTo(3, 12);
    }
  });

  it("q = 0 by hand: zones {a, b} and {b, c}: gamma 3, alpha 2, beta 1.5", () => {
    expect(
      hillBeta(
        [
          [1, 5, 0],
          [0, 2, 7],
        ],
        0,
      ),
    ).toEqual({ order: 0, gamma: 3, alpha: 2, beta: 1.5, zones: 2 });
  });

  it("refuses an empty zone and misaligned zones", () => {
    expect(() =>
      hillBeta(
        [
          [1, 2],
          [0, 0],
        ],
        1,
      ),
    ).toThrow(DiversityInputError);
    expect(() => hillBeta([[1, 2], [1]], 1)).toThrow(DiversityInputError);
  });
});

describe("properties", () => {
  const pairArb = fc
    .integer({ min: 1, max: 15 })
    .chain((S) =>
      fc.tuple(
        fc.array(fc.integer({ min: 0, max: 30 }), { minLength: S, maxLength: S }),
        fc.array(fc.integer({ min: 0, max: 30 }), { minLength: S, maxLength: S }),
      ),
    );

  it("similarities lie in [0, 1], are symmetric, and equal 1 for a zone with itself", () => {
    fc.assert(
      fc.property(pairArb, ([a, b]) => {
        const s = zoneSimilarity(a, b);
        const t = zoneSimilarity(b, a);
        for (const k of ["sorensen", "jaccard", "sorensenAdjusted", "jaccardAdjusted"] as const) {
          expect(s[k]).toBeGreaterThanOrEqual(0);
          expect(s[k]).toBeLessThanOrEqual(1);
          expect(s[k]).toBeCloseTo(t[k], 12);
        }
        expect(s.jaccardAdjusted).toBeLessThanOrEqual(s.sorensenAdjusted + 1e-12);
        if (a.some((x) => x > 0)) {
          const self = zoneSimilarity(a, a);
          expect([self.sorensen, self.jaccard, self.sorensenAdjusted, self.jaccardAdjusted]).toEqual([1, 1, 1, 1]);
        }
      }),
    );
  });

  it("incidence similarity: in [0, 1]; adding empty sessions changes nothing observed", () => {
    const unitsArb = (S: number) =>
      fc.array(fc.array(fc.integer({ min: 0, max: 1 }), { minLength: S, maxLength: S }), {
        minLength: 1,
        maxLength: 6,
      });
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 8 }).chain((S) => fc.tuple(unitsArb(S), unitsArb(S))),
        fc.integer({ min: 1, max: 3 }),
        ([a, b], extra) => {
          const s = zoneSimilarityIncidence(a, b);
          for (const k of ["sorensen", "jaccard", "sorensenAdjusted", "jaccardAdjusted"] as const) {
            expect(s[k]).toBeGreaterThanOrEqual(0);
            expect(s[k]).toBeLessThanOrEqual(1);
          }
          const width = a[0]?.length ?? 0;
          const padded = zoneSimilarityIncidence(
            [...a, ...Array.from({ length: extra }, () => new Array<number>(width).fill(0))],
            b,
          );
          expect([padded.shared, padded.sorensen, padded.jaccard]).toEqual([s.shared, s.sorensen, s.jaccard]);
        },
      ),
    );
  });

  it("beta lies between 1 and the number of zones, and Hill numbers of the pool do not increase with q", () => {
    const zonesArb = fc.tuple(fc.integer({ min: 1, max: 4 }), fc.integer({ min: 1, max: 10 })).chain(([N, S]) =>
      fc.array(
        fc.array(fc.integer({ min: 0, max: 20 }), { minLength: S, maxLength: S }).filter((z) => z.some((x) => x > 0)),
        { minLength: N, maxLength: N },
      ),
    );
    fc.assert(
      fc.property(zonesArb, (zones) => {
        let prev = Infinity;
        for (const q of [0, 0.5, 1, 1.5, 2]) {
          const b = hillBeta(zones, q);
          expect(b.beta).toBeGreaterThanOrEqual(1 - 1e-9);
          expect(b.beta).toBeLessThanOrEqual(zones.length + 1e-9);
          expect(b.gamma).toBeLessThanOrEqual(prev + 1e-9);
          prev = b.gamma;
        }
      }),
    );
  });
});
