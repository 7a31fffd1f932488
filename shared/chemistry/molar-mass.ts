/**
 * Molar masses, g/mol, built from the IUPAC/CIAAW standard atomic weights (2021), using the
 * conventional single values for elements published as intervals (H, C, N, O, Mg, S, Cl).
 */
const atomicWeight = {
  H: 1.008,
  C: 12.011,
  N: 14.007,
  O: 15.999,
  Na: 22.98976928,
  Mg: 24.305,
  P: 30.973761998,
  S: 32.06,
  Cl: 35.45,
  Ca: 40.078,
} as const;

type Element = keyof typeof atomicWeight;

function formulaMass(parts: Partial<Record<Element, number>>): number {
  return Object.entries(parts).reduce(
    (sum, [element, count]) => sum + atomicWeight[element as Element] * count,
    0,
  );
}

const water = formulaMass({ H: 2, O: 1 });

export const molarMass = {
  N: atomicWeight.N,
  P: atomicWeight.P,
  Ca: atomicWeight.Ca,
  Mg: atomicWeight.Mg,
  CaO: formulaMass({ Ca: 1, O: 1 }),
  CaCO3: formulaMass({ Ca: 1, C: 1, O: 3 }),
  NO3: formulaMass({ N: 1, O: 3 }),
  PO4: formulaMass({ P: 1, O: 4 }),
  NaHCO3: formulaMass({ Na: 1, H: 1, C: 1, O: 3 }),
  Na2CO3: formulaMass({ Na: 2, C: 1, O: 3 }),
  CaCl2_2H2O: formulaMass({ Ca: 1, Cl: 2 }) + 2 * water,
  MgCl2_6H2O: formulaMass({ Mg: 1, Cl: 2 }) + 6 * water,
  MgSO4_7H2O: formulaMass({ Mg: 1, S: 1, O: 4 }) + 7 * water,
} as const;
