/** Amplitude ratios in decibels: L = 20·log10(a/b) (IEC 60027-3 field quantity level). */
export const AMPLITUDE_DECIBELS = 20;

export function amplitudeDb(ratio: number): number {
  return AMPLITUDE_DECIBELS * Math.log10(ratio);
}
