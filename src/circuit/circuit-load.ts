/**
 * The load the coils drive, after command-line what-ifs: volume pot, tone
 * pot and capacitor, optional treble bleed, cable and amplifier input, and
 * the mains frequency used for hum. Resolved once from the guitar and the
 * overrides; everything after reads only this.
 *
 * Circuit (docs/physics.md §1.1; common practice for the controls):
 *
 *   hot ──┬── volume track top (1 − r)·Rv ──┬── out ── cable C ∥ amp R ∥ amp C ── ground
 *         │   [treble bleed, hot to out]     │
 *         ├── tone: r_t·Rt + capacitor ─ gnd └── volume track bottom r·Rv ── ground
 *
 * r is the volume wiper fraction (pot-taper.ts); the tone pot is a variable
 * resistor of r_t·Rt, so setting 10 is its full resistance.
 */
import { InputError } from '../errors/index.js';
import { CABLE_CAPACITANCE_MAX_F, CABLE_CAPACITANCE_MIN_F, type Guitar, type Taper, type TrebleBleed } from '../guitar/index.js';
import { KNOB_FULL_SCALE, wiperFraction } from './pot-taper.js';

/** Mains frequencies hum is evaluated at. */
export type MainsHz = 50 | 60;

/** Default mains frequency (docs/design.md: 60 Hz unless `--mains 50`). */
export const DEFAULT_MAINS_HZ: MainsHz = 60;

/**
 * Dipole estimate of the hum field's gradient (docs/physics.md §6.1): a
 * dipole-like source at distance r gives B ∝ 1/r³, so d ln B/dx = 3/r. The
 * default takes the source (an amplifier's transformer, a lamp) 1 m away
 * (from memory: a player standing about a metre from the amplifier): 3 /m,
 * i.e. 3 % per centimetre along the strings.
 */
export const DIPOLE_FIELD_EXPONENT = 3;
export const DEFAULT_HUM_SOURCE_DISTANCE_M = 1;
export const DEFAULT_HUM_GRADIENT_PER_M = DIPOLE_FIELD_EXPONENT / DEFAULT_HUM_SOURCE_DISTANCE_M;
/** Steepest gradient accepted: a source 0.15 m away (closer than any practical hum source, our own bound). */
export const HUM_GRADIENT_MAX_PER_M = 20;

/** Plausible total cable capacitance: the range the guitar file accepts (1 pF to 20 nF, src/guitar/guitar-spec.ts). */
export { CABLE_CAPACITANCE_MIN_F, CABLE_CAPACITANCE_MAX_F };

/** What-if settings that replace the guitar file's values; validated once by `resolveCircuitLoad`. */
export interface CircuitOverrides {
  /** Volume knob, 0 (down) to 10 (up). Default: the guitar file's setting. */
  readonly volumeSetting?: number;
  /** Tone knob, 0 to 10. Default: the guitar file's setting. Only for a guitar with a tone control. */
  readonly toneSetting?: number;
  /** Total cable capacitance, farads, 1 pF to 20 nF. Default: the guitar file's cable. */
  readonly cableCapacitanceF?: number;
  /** Mains frequency for hum, 50 or 60 Hz. Default 60. */
  readonly mainsHz?: MainsHz;
  /**
   * Gradient of the hum field along the strings, relative change per metre
   * (d ln B/dx; 0.03 per cm = 3 /m), 0 to HUM_GRADIENT_MAX_PER_M. Default
   * DEFAULT_HUM_GRADIENT_PER_M (measure-hum.ts, docs/physics.md §6.1).
   */
  readonly humGradientPerM?: number;
}

export interface VolumeLoad {
  readonly potOhms: number;
  readonly setting: number;
  readonly taper: Taper;
  readonly audioMidpoint: number;
  /** Fraction of the track from wiper to ground. */
  readonly wiperFraction: number;
  /** Track between hot and the wiper, ohms (0 when fully up). */
  readonly topOhms: number;
  /** Track between the wiper and ground, ohms (0 when fully down). */
  readonly bottomOhms: number;
}

export interface ToneLoad {
  readonly potOhms: number;
  readonly setting: number;
  readonly taper: Taper;
  readonly audioMidpoint: number;
  /** Resistance the pot puts in series with the capacitor, ohms. */
  readonly resistanceOhms: number;
  readonly capacitorF: number;
}

/** The load actually used (the `settings` of `analyze --json`). */
export interface CircuitLoad {
  readonly volume: VolumeLoad;
  readonly tone: ToneLoad | null;
  readonly trebleBleed: TrebleBleed | null;
  readonly cableCapacitanceF: number;
  readonly ampResistanceOhms: number;
  readonly ampCapacitanceF: number;
  readonly mainsHz: MainsHz;
  /** Relative change of the hum field per metre along the strings (docs/physics.md §6.1). */
  readonly humGradientPerM: number;
  /** True when nothing reaches the amplifier (volume at 0 shorts the output to ground). */
  readonly silent: boolean;
}

function checkKnob(value: number, path: string): void {
  if (!Number.isFinite(value) || value < 0 || value > KNOB_FULL_SCALE) {
    throw InputError.at(path, `a knob setting from 0 to ${KNOB_FULL_SCALE}`, value);
  }
}

/** Validate the overrides and combine them with the guitar's controls. Throws InputError naming the override. */
export function resolveCircuitLoad(guitar: Guitar, overrides: CircuitOverrides = {}): CircuitLoad {
  const { volume, tone, trebleBleed } = guitar.controls;
  const volumeSetting = overrides.volumeSetting ?? volume.setting;
  checkKnob(volumeSetting, 'volumeSetting');
  if (overrides.toneSetting !== undefined && tone === null) {
    throw InputError.at('toneSetting', 'no tone setting (this guitar has no tone control)', overrides.toneSetting);
  }
  const cable = overrides.cableCapacitanceF ?? guitar.cable.capacitanceF;
  if (!Number.isFinite(cable) || cable < CABLE_CAPACITANCE_MIN_F || cable > CABLE_CAPACITANCE_MAX_F) {
    // The guitar validator and the option parser refuse such a cable first, each with the user's own path.
    throw InputError.at(overrides.cableCapacitanceF === undefined ? 'cable' : 'overrides.cableCapacitanceF', 'a total cable capacitance between 1 pF and 20 nF', cable);
  }
  const mainsHz = overrides.mainsHz ?? DEFAULT_MAINS_HZ;
  if (mainsHz !== 50 && mainsHz !== 60) throw InputError.at('mainsHz', '50 or 60', mainsHz);
  const humGradientPerM = overrides.humGradientPerM ?? DEFAULT_HUM_GRADIENT_PER_M;
  if (!Number.isFinite(humGradientPerM) || humGradientPerM < 0 || humGradientPerM > HUM_GRADIENT_MAX_PER_M) {
    throw InputError.at('humGradientPerM', `a hum-field gradient from 0 to ${HUM_GRADIENT_MAX_PER_M} per metre`, humGradientPerM);
  }

  const fraction = wiperFraction(volume, volumeSetting);
  const volumeLoad: VolumeLoad = Object.freeze({
    potOhms: volume.potOhms,
    setting: volumeSetting,
    taper: volume.taper,
    audioMidpoint: volume.audioMidpoint,
    wiperFraction: fraction,
    topOhms: volume.potOhms * (1 - fraction),
    bottomOhms: volume.potOhms * fraction,
  });
  let toneLoad: ToneLoad | null = null;
  if (tone !== null) {
    const toneSetting = overrides.toneSetting ?? tone.setting;
    checkKnob(toneSetting, 'toneSetting');
    toneLoad = Object.freeze({
      potOhms: tone.potOhms,
      setting: toneSetting,
      taper: tone.taper,
      audioMidpoint: tone.audioMidpoint,
      resistanceOhms: tone.potOhms * wiperFraction(tone, toneSetting),
      capacitorF: tone.capacitorF,
    });
  }
  return Object.freeze({
    volume: volumeLoad,
    tone: toneLoad,
    trebleBleed,
    cableCapacitanceF: cable,
    ampResistanceOhms: guitar.amp.resistanceOhms,
    ampCapacitanceF: guitar.amp.capacitanceF,
    mainsHz,
    humGradientPerM,
    silent: volumeLoad.bottomOhms === 0,
  });
}
