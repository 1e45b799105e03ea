/**
 * Mix calculators for feedstocks and bedding: C:N and moisture of a mix,
 * mass-weighted on dry matter (Cornell "Getting the Right Mix", T. Richard &
 * N. Trautmann), and how much of a second material reaches a target.
 *
 *   R = Σ Qᵢ·Cᵢ·(100 − Mᵢ) / Σ Qᵢ·Nᵢ·(100 − Mᵢ)   (mix C:N)
 *   G = Σ Qᵢ·Mᵢ / Σ Qᵢ                            (mix moisture, % of wet mass)
 *
 * Q = wet mass, M = moisture (% of wet mass), C and N = % of dry mass.
 * A mix C:N is never a plain or mass-weighted average of the ingredients' ratios.
 */

/** One ingredient of a mix. Give `carbonPct` or `cnRatio` (carbon = N × C:N). */
export interface MixIngredient {
  name?: string;
  /** Wet mass, any unit as long as all ingredients use the same. */
  wetMass: number;
  /** Moisture, % of wet mass (0..100). */
  moisturePct: number;
  /** Nitrogen, % of dry mass. */
  nitrogenPct: number;
  /** Carbon, % of dry mass. */
  carbonPct?: number | null;
  /** C:N ratio, used for carbon when `carbonPct` is absent. */
  cnRatio?: number | null;
}

/** Totals and ratios of a mix. */
export interface MixProperties {
  wetMass: number;
  dryMass: number;
  waterMass: number;
  carbonMass: number;
  nitrogenMass: number;
  cnRatio: number;
  moisturePct: number;
}

/** Amount of a second material to reach a target, or why it cannot. */
export interface TargetAmount {
  amount: number | null;
  reason: string | null;
}

function num(x: unknown, what: string, lo = -Infinity, hi = Infinity): number {
  if (typeof x !== 'number' || !Number.isFinite(x) || x < lo || x > hi) {
    throw new RangeError(`${what} must be a finite number in ${lo}..${hi}, got ${String(x)}`);
  }
  return x;
}

/** %C of dry mass from %N and C:N (%C = %N × C:N, Cornell "C/N Ratio"). Throws RangeError on negative or non-finite input. */
export function carbonPct(nitrogenPct: number, cnRatio: number): number {
  return num(nitrogenPct, 'nitrogen %', 0, 100) * num(cnRatio, 'C:N', 0);
}

/** Moisture (% of wet mass) from wet and oven-dry masses: (wet − dry) / wet × 100. Throws RangeError unless 0 ≤ dry ≤ wet and wet > 0. */
export function moisturePctFromMasses(wetMass: number, dryMass: number): number {
  num(wetMass, 'wet mass', 0);
  num(dryMass, 'dry mass', 0);
  if (wetMass <= 0 || dryMass > wetMass) throw new RangeError('need 0 ≤ dry mass ≤ wet mass and wet mass > 0');
  return ((wetMass - dryMass) / wetMass) * 100;
}

function carbonOf(i: MixIngredient): number {
  if (i.carbonPct != null) return num(i.carbonPct, 'carbon %', 0, 100);
  if (i.cnRatio != null) return carbonPct(i.nitrogenPct, i.cnRatio);
  throw new RangeError(`${i.name ?? 'ingredient'}: give carbonPct or cnRatio`);
}

/**
 * Totals, C:N (R) and moisture (G) of a mix. Throws RangeError on an empty
 * mix, invalid numbers, zero total mass, or no nitrogen in the dry matter.
 */
export function mixProperties(ingredients: readonly MixIngredient[]): MixProperties {
  if (!Array.isArray(ingredients) || ingredients.length === 0) throw new RangeError('a mix needs at least one ingredient');
  let wet = 0;
  let water = 0;
  let dry = 0;
  let c = 0;
  let n = 0;
  for (const i of ingredients) {
    const q = num(i.wetMass, 'wet mass', 0);
    const m = num(i.moisturePct, 'moisture %', 0, 100);
    const nPct = num(i.nitrogenPct, 'nitrogen %', 0, 100);
    const cPct = carbonOf(i);
    const d = (q * (100 - m)) / 100;
    wet += q;
    water += (q * m) / 100;
    dry += d;
    c += (d * cPct) / 100;
    n += (d * nPct) / 100;
  }
  if (wet <= 0) throw new RangeError('the mix has no mass');
  if (n <= 0) throw new RangeError('the mix has no nitrogen in its dry matter, so C:N is undefined');
  return { wetMass: wet, dryMass: dry, waterMass: water, carbonMass: c, nitrogenMass: n, cnRatio: c / n, moisturePct: (water / wet) * 100 };
}

/** Mix C:N, R = ΣQ·C·(100−M) / ΣQ·N·(100−M). Throws like mixProperties. */
export function mixCN(ingredients: readonly MixIngredient[]): number {
  return mixProperties(ingredients).cnRatio;
}

/** Mix moisture (% of wet mass), G = ΣQ·M / ΣQ. Throws like mixProperties. */
export function mixMoisture(ingredients: readonly MixIngredient[]): number {
  return mixProperties(ingredients).moisturePct;
}

/**
 * Wet mass of a second material to bring a first one to a target moisture:
 * Q₂ = Q₁(G − M₁)/(M₂ − G). Returns amount 0 when the first is already at the
 * target, and `{ amount: null, reason }` when the target is not strictly
 * between the two moistures. Throws RangeError on invalid numbers.
 */
export function amountForMoisture(
  first: { wetMass: number; moisturePct: number },
  second: { moisturePct: number },
  targetMoisturePct: number,
): TargetAmount {
  const q1 = num(first.wetMass, 'wet mass', 0);
  const m1 = num(first.moisturePct, 'moisture %', 0, 100);
  const m2 = num(second.moisturePct, 'moisture %', 0, 100);
  const g = num(targetMoisturePct, 'target moisture %', 0, 100);
  if (g === m1) return { amount: 0, reason: null };
  if (!((g > m1 && g < m2) || (g < m1 && g > m2))) {
    return {
      amount: null,
      reason: `a ${g}% target is not between the first material (${m1}%) and the second (${m2}%), so no amount of the second reaches it`,
    };
  }
  return { amount: (q1 * (g - m1)) / (m2 - g), reason: null };
}

/**
 * Wet mass of a second material to bring a first one to a target C:N:
 * Q₂ = Q₁·N₁·(R − R₁)·(100 − M₁) / [N₂·(R₂ − R)·(100 − M₂)] (REFERENCES §2, derived).
 * Returns 0 when the first is already at the target, and `{ amount: null,
 * reason }` when the target is not strictly between the two C:N ratios or the
 * second material has no nitrogen or no dry matter. Throws RangeError on invalid numbers.
 */
export function amountForCN(
  first: MixIngredient,
  second: Omit<MixIngredient, 'wetMass'>,
  targetCN: number,
): TargetAmount {
  const q1 = num(first.wetMass, 'wet mass', 0);
  const m1 = num(first.moisturePct, 'moisture %', 0, 100);
  const n1 = num(first.nitrogenPct, 'nitrogen %', 0, 100);
  const m2 = num(second.moisturePct, 'moisture %', 0, 100);
  const n2 = num(second.nitrogenPct, 'nitrogen %', 0, 100);
  const r = num(targetCN, 'target C:N', 0);
  if (n1 <= 0 || m1 >= 100) throw new RangeError('the first material needs nitrogen and dry matter');
  const r1 = carbonOf(first) / n1;
  if (n2 <= 0 || m2 >= 100) {
    return { amount: null, reason: 'the second material has no nitrogen or no dry matter, so its C:N is undefined' };
  }
  const r2 = carbonOf({ ...second, wetMass: 0 }) / n2;
  if (r === r1) return { amount: 0, reason: null };
  if (!((r > r1 && r < r2) || (r < r1 && r > r2))) {
    return {
      amount: null,
      reason: `a C:N of ${r} is not between the first material (${Number(r1.toFixed(2))}) and the second (${Number(r2.toFixed(2))}), so no amount of the second reaches it`,
    };
  }
  return { amount: (q1 * n1 * (r - r1) * (100 - m1)) / (n2 * (r2 - r) * (100 - m2)), reason: null };
}
