/** Decibels of amplitude: dB = 20·log10(ratio) (IEC 60027-3 field quantities). */
const DB_PER_DECADE = 20;

/** Amplitude ratio for `db` decibels: 10^(dB/20). */
export function decibelsToGain(db: number): number {
  return 10 ** (db / DB_PER_DECADE);
}

/** Decibels for an amplitude ratio: 20·log10(ratio). */
export function gainToDecibels(gain: number): number {
  return DB_PER_DECADE * Math.log10(gain);
}
