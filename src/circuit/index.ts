export type { Sign } from './coil-signs.js';
export { connectionSign, humSign, magnetSign, phaseSign, windingSign } from './coil-signs.js';
export { audioTaperBase, wiperFraction, KNOB_FULL_SCALE } from './pot-taper.js';
export type { CircuitLoad, CircuitOverrides, MainsHz, ToneLoad, VolumeLoad } from './circuit-load.js';
export {
  resolveCircuitLoad,
  DEFAULT_MAINS_HZ,
  CABLE_CAPACITANCE_MIN_F,
  CABLE_CAPACITANCE_MAX_F,
  DEFAULT_HUM_GRADIENT_PER_M,
  DEFAULT_HUM_SOURCE_DISTANCE_M,
  HUM_GRADIENT_MAX_PER_M,
} from './circuit-load.js';
export type { CoilModel, CoilPhasors } from './coil-model.js';
export { coilImpedanceAt, coilModelOf, coilSeriesImpedance, createCoilPhasors, evaluateCoil } from './coil-model.js';
export type { PreparedCircuit } from './prepare-circuit.js';
export { prepareCircuit, retuneCircuit } from './prepare-circuit.js';
export { solveLoadGain, solveSourceFactors, solveTransfers } from './solve-transfers.js';
export { JAVASCRIPT_PASSES, reduceSeriesParallel } from './solve-series-parallel.js';
export type { SeriesParallelArrays, SolvePasses, SolveWorkspace } from './solve-series-parallel.js';
export type { CoilDrive } from './coil-drive.js';
export { coilDriveAt, drivePairIndex, drivenPowerAt, incoherentCoilDrive, sampleCoilDrive } from './coil-drive.js';
export type { DrivenResponse, DrivenResponseInputs } from './driven-response.js';
export { solveDrivenResponse, solveGraphDrivenResponse } from './driven-response.js';
export {
  analysisFrequencies,
  logSpacedFrequencies,
  ANALYSIS_POINTS,
  AUDIO_BAND_HIGH_HZ,
  AUDIO_BAND_LOW_HZ,
  REFERENCE_FREQUENCY_HZ,
} from './frequency-grid.js';
export type { ResonanceInputs, ResonanceMetrics } from './measure-resonance.js';
export { measureResonance, LOG_FREQUENCY_TOLERANCE, CANCELLED_FRACTION, CANCELLED_REASON, MIN_PEAK_PROMINENCE, MIN_PEAK_PROMINENCE_DB, SILENT_REASON } from './measure-resonance.js';
export type { HumCategory, HumFields } from './measure-hum.js';
export {
  FIELD_DIRECTIONS,
  prepareHumFields,
  worseHumDb,
  humCategory,
  humDecibels,
  humFieldWeights,
  humMagnitudeAt,
  isHumCancelling,
  measureHum,
  measureHumReference,
  HUM_CANCELLING_DB,
  HUM_FLOOR_DB,
  HUM_REDUCING_DB,
} from './measure-hum.js';
export { measureResponseDb, RESPONSE_FLOOR_DB } from './measure-response.js';
export type { CircuitAnalysis, CircuitMetricsOptions, CircuitMetricsSolver, WiringCircuitMetrics } from './measure-circuit-metrics.js';
export { measureCircuitMetrics, measureGraphCircuitMetrics, prepareCircuitMetrics, DEFAULT_CIRCUIT_METRICS_OPTIONS } from './measure-circuit-metrics.js';
export { amplitudeDb } from './decibels.js';
export type { CoilPlacement, Lead, WiringLayout } from './layout-wiring.js';
export { layoutWiring, networkResistanceOhms, HOT_NODE, GROUND_NODE } from './layout-wiring.js';
export type { NetlistOptions, SourcePhasor } from './render-netlist.js';
export { renderGraphNetlist, renderNetlist, DEFAULT_NETLIST_OPTIONS } from './render-netlist.js';
export { renderBuildSheet, WORKSHOP_CAUTIONS } from './render-build-sheet.js';
export type { CircuitGraph, GraphCoil } from './circuit-graph.js';
export { connectsHotToGround, graphOfNetwork } from './circuit-graph.js';
export { solveCoilsImpedance, solveNodalTransfers } from './solve-nodal.js';
export type { CoilCoupling } from './coil-coupling.js';
export { coilCouplings, mutualInductanceH } from './coil-coupling.js';
export { phaseClassKey, phaseClassNetwork, phaseClassSigns } from './phase-class.js';
export { usesCoupledCoils } from './coil-coupling.js';
export { parseConnections } from './parse-connections.js';
export type { ImpedancePoint } from './parse-impedance-sweep.js';
export { parseImpedanceSweep, MIN_SWEEP_POINTS } from './parse-impedance-sweep.js';
export type { CoilLossModel, FittedCoil, PeakMeasurement, SweepFitOptions } from './fit-coil.js';
export { fitCoilToPeak, fitCoilToSweep, measureUnloadedPeak, DEFAULT_SWEEP_FIT_OPTIONS } from './fit-coil.js';
export { renderSampleSweep, SAMPLE_SWEEP_COIL, SAMPLE_SWEEP_POINTS } from './sample-coil-sweep.js';
export type { LoadedResponse, LoadFitOptions, LoadFittedCoil, LoadRatioPoint } from './fit-coil-to-loads.js';
export { coilLoadRatioAt, fitCoilToLoadedResponses, withInstrument, DEFAULT_INSTRUMENT_OHMS, DEFAULT_LOAD_FIT_OPTIONS } from './fit-coil-to-loads.js';
