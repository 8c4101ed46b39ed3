// Input checks shared by every public function. Counts must be non-negative integers
// small enough to stay exact in a double; anything else is a caller bug, so it throws.

export type DiversityInputErrorCode =
  | "not-an-array"
  | "not-a-number"
  | "not-finite"
  | "negative"
  | "not-integer"
  | "too-large"
  | "ragged-units"
  | "invalid-option";

export class DiversityInputError extends Error {
  readonly code: DiversityInputErrorCode;
  /** Where the bad value sits, e.g. "counts[3]" or "units[2][5]". */
  readonly path: string;

  constructor(code: DiversityInputErrorCode, path: string, message: string) {
    super(`${path}: ${message}`);
    this.name = "DiversityInputError";
    this.code = code;
    this.path = path;
  }
}

export function describe(value: unknown, path: string): DiversityInputError {
  if (typeof value !== "number") {
    return new DiversityInputError("not-a-number", path, `expected a non-negative integer, got ${typeof value}`);
  }
  if (Number.isNaN(value) || !Number.isFinite(value)) {
    return new DiversityInputError("not-finite", path, `expected a non-negative integer, got ${value}`);
  }
  if (value < 0) return new DiversityInputError("negative", path, `counts cannot be negative (got ${value})`);
  if (!Number.isInteger(value)) {
    return new DiversityInputError("not-integer", path, `counts must be whole numbers (got ${value})`);
  }
  return new DiversityInputError("too-large", path, `value ${value} exceeds ${Number.MAX_SAFE_INTEGER}`);
}

export function isCount(v: unknown): v is number {
  return typeof v === "number" && Number.isInteger(v) && v >= 0 && v <= Number.MAX_SAFE_INTEGER;
}

/** Throws unless `values` is an array of non-negative safe integers; returns their sum. */
export function checkCounts(values: readonly number[], label = "counts"): number {
  if (!Array.isArray(values)) throw new DiversityInputError("not-an-array", label, "expected an array of counts");
  let total = 0;
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (!isCount(v)) throw describe(v, `${label}[${i}]`);
    total += v;
  }
  if (total > Number.MAX_SAFE_INTEGER) {
    throw new DiversityInputError("too-large", label, `total ${total} exceeds ${Number.MAX_SAFE_INTEGER}`);
  }
  return total;
}

/**
 * Throws unless `units` is an array of equally long rows of non-negative integers
 * (rows = sampling units, columns = species). Returns the row length (0 for no units).
 */
export function checkUnits(units: readonly (readonly number[])[], label = "units"): number {
  if (!Array.isArray(units))
    throw new DiversityInputError("not-an-array", label, "expected an array of sampling units");
  let width = -1;
  for (let t = 0; t < units.length; t++) {
    const row = units[t];
    if (!Array.isArray(row)) {
      throw new DiversityInputError(
        "not-an-array",
        `${label}[${t}]`,
        "each sampling unit must be an array of counts per species",
      );
    }
    if (width < 0) width = row.length;
    else if (row.length !== width) {
      throw new DiversityInputError(
        "ragged-units",
        `${label}[${t}]`,
        `every sampling unit must list the same ${width} species (this one has ${row.length})`,
      );
    }
    for (let s = 0; s < row.length; s++) {
      const v = row[s];
      if (!isCount(v)) throw describe(v, `${label}[${t}][${s}]`);
    }
  }
  return Math.max(width, 0);
}

/** Throws unless `value` is a non-negative integer (a sample size or number of units). */
export function checkSize(value: number, path: string): void {
  if (!isCount(value)) throw describe(value, path);
}

export function invalidOption(path: string, message: string): DiversityInputError {
  return new DiversityInputError("invalid-option", path, message);
}
