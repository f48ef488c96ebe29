/**
 * The shared standard chain catalogue (organisation_id NULL), seeded at start.
 *
 * Pitch and minimum tensile strength come from the standards named per row. Mass per length and axial
 * stiffness have no published table (docs/references.md: treat E·A as an input): they are approximate or
 * assumed values, and each row's note says so. Replace them with the chain manufacturer's data sheet
 * values in an organisation's own catalogue entry before relying on a result.
 */
import type { ChainSpecView } from "./service";
const IN = 0.0254; // m per inch, exact
const LBF = 4.4482216152605; // N per lbf, exact
const LB_PER_FT = 0.45359237 / 0.3048; // kg/m per lb/ft

/**
 * E·A assumed as 30 × the minimum breaking strength (the ratio of the scenario format's example chain,
 * 1.5e7 N / 5e5 N). A chain at one fifth of its breaking strength then stretches 1/150 ≈ 0.67 %: 0.8 m
 * over 120 m if the whole length carried that tension, the same order as the 450–600 mm quoted for a
 * heavy lift chain of about 120 m at working load (docs/references.md, common practice, no source).
 * An assumption, not a published value.
 */
export const ASSUMED_STIFFNESS_PER_STRENGTH = 30;

/** A row of the shared standard catalogue (its note is always given). */
export type StandardChain = Pick<ChainSpecView, "designation" | "pitch" | "massPerLength" | "axialStiffness" | "breakingStrength" | "source"> & { note: string };

const STIFFNESS_NOTE = `Axial stiffness E·A assumed as ${ASSUMED_STIFFNESS_PER_STRENGTH} × breaking strength (no published table).`;

// ASME B29.1 No. n: pitch n/80 in; minimum ultimate tensile strength 12,500·P² lbf (P in inches).
// Weight per foot: approximate values recalled from memory (about 1.7 lb/ft for No. 80 … 16.5 for No. 240).
const ASME_SIZES: { no: number; lbPerFt: number }[] = [
  { no: 80, lbPerFt: 1.7 },
  { no: 100, lbPerFt: 2.6 },
  { no: 120, lbPerFt: 3.7 },
  { no: 140, lbPerFt: 5.0 },
  { no: 160, lbPerFt: 6.6 },
  { no: 180, lbPerFt: 9.1 },
  { no: 200, lbPerFt: 10.9 },
  { no: 240, lbPerFt: 16.5 },
];

const asme: StandardChain[] = ASME_SIZES.map(({ no, lbPerFt }) => {
  const pitchIn = no / 80;
  const breakingStrength = 12_500 * pitchIn ** 2 * LBF;
  return {
    designation: `ASME B29.1 No. ${no}`,
    pitch: pitchIn * IN,
    massPerLength: lbPerFt * LB_PER_FT,
    axialStiffness: ASSUMED_STIFFNESS_PER_STRENGTH * breakingStrength,
    breakingStrength,
    source: `ASME B29.1 (ANSI standard roller chain, single strand): pitch ${no}/80 in, minimum tensile strength 12,500·P² lbf`,
    note: `Mass per length ≈ ${lbPerFt} lb/ft: approximate, recalled from memory. ${STIFFNESS_NOTE}`,
  };
});

// ISO 606 B-series (European) single strand: pitch = designation number sixteenths of an inch; minimum
// breaking force in kN and mass per length both recalled from memory, not checked against the standard.
const ISO_SIZES: { size: string; sixteenths: number; kN: number; kgPerM: number }[] = [
  { size: "16B", sixteenths: 16, kN: 60, kgPerM: 2.7 },
  { size: "20B", sixteenths: 20, kN: 95, kgPerM: 3.6 },
  { size: "24B", sixteenths: 24, kN: 160, kgPerM: 6.7 },
  { size: "28B", sixteenths: 28, kN: 200, kgPerM: 8.3 },
  { size: "32B", sixteenths: 32, kN: 250, kgPerM: 10.5 },
  { size: "40B", sixteenths: 40, kN: 355, kgPerM: 16.4 },
  { size: "48B", sixteenths: 48, kN: 560, kgPerM: 25 },
];

const iso: StandardChain[] = ISO_SIZES.map(({ size, sixteenths, kN, kgPerM }) => ({
  designation: `ISO 606 ${size}`,
  pitch: (sixteenths / 16) * IN,
  massPerLength: kgPerM,
  axialStiffness: ASSUMED_STIFFNESS_PER_STRENGTH * kN * 1000,
  breakingStrength: kN * 1000,
  source: `ISO 606 B-series single-strand roller chain ${size}: pitch ${sixteenths}/16 in`,
  note: `Minimum breaking force ${kN} kN: recalled from memory, not checked against the standard. Mass per length ≈ ${kgPerM} kg/m: approximate, from memory. ${STIFFNESS_NOTE}`,
}));

export const STANDARD_CHAINS: readonly StandardChain[] = [...asme, ...iso];
