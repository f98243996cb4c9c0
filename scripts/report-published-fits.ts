/**
 * Prints how the coil model, fitted, meets the published pickup measurements
 * of test/data/published/ (docs/physics.md §1.6): fitted values, and the
 * peak of each load's loaded-over-open response, measured against model.
 * Usage: npx tsx scripts/report-published-fits.ts
 */
import { CONSTRUCTION_DEFAULTS } from '../src/guitar/index.js';
import { type PublishedPickup, fitPublishedPickup, measuredPeak, modelPeak, readPublishedPickups } from '../test/support/published-pickups.js';
import type { LoadedResponse, LoadFittedCoil } from '../src/circuit/index.js';

const LOAD_NAMES = ['200 kΩ ∥ 470 pF', '10 nF'];

function describeFit(pickup: PublishedPickup, label: string, fit: LoadFittedCoil, checked: readonly LoadedResponse[]): void {
  process.stdout.write(
    `  ${label}: L ${fit.inductanceH.toFixed(3)} H, C ${(fit.capacitanceF * 1e12).toFixed(0)} pF, κ ${fit.eddyShare.toFixed(3)}, f_e ${fit.eddyCornerHz.toFixed(0)} Hz, rms ${(100 * fit.rmsRelativeError).toFixed(2)} %\n`,
  );
  pickup.responses.forEach((response, i) => {
    const measured = measuredPeak(response);
    const model = modelPeak(fit, pickup.instrumentOhms, response);
    const used = checked.includes(response) ? 'fitted' : 'predicted';
    process.stdout.write(
      `    ${LOAD_NAMES[i]} (${used}): measured ${measured.frequencyHz.toFixed(0)} Hz ×${measured.height.toFixed(3)} (${(20 * Math.log10(measured.height)).toFixed(2)} dB); model ${model.frequencyHz.toFixed(0)} Hz ×${model.height.toFixed(3)} (${(20 * Math.log10(model.height)).toFixed(2)} dB); frequency ${(100 * (model.frequencyHz / measured.frequencyHz - 1)).toFixed(1)} %, height ${(100 * (model.height / measured.height - 1)).toFixed(1)} %\n`,
    );
  });
}

for (const pickup of readPublishedPickups()) {
  process.stdout.write(`${pickup.name}: ${pickup.description}\n`);
  describeFit(pickup, 'both loads', fitPublishedPickup(pickup), pickup.responses);
  describeFit(pickup, 'loaded sweep only', fitPublishedPickup(pickup, [pickup.responses[0]]), [pickup.responses[0]]);
  describeFit(pickup, 'capacitor sweep only', fitPublishedPickup(pickup, [pickup.responses[1]]), [pickup.responses[1]]);
  if (pickup.construction !== null) {
    const d = CONSTRUCTION_DEFAULTS[pickup.construction];
    describeFit(pickup, `defaults of "${pickup.construction}" (κ, f_e fixed)`, fitPublishedPickup(pickup, pickup.responses, { eddy: { share: d.eddyShare, cornerHz: d.eddyCornerHz } }), pickup.responses);
  }
}
