/**
 * The fixed dc-case/1 vocabulary: symptoms, observations and their answers, drives, feedback and
 * cooling kinds. Rules, questions and case files may use only these names.
 */

export const SYMPTOMS = {
  'reversed-rotation': 'runs the wrong way',
  'will-not-reverse': 'does not change direction when asked to',
  overspeed: 'runs faster than it should',
  'speed-low': 'runs slower than it should',
  'speed-unstable': 'speed hunts or surges',
  sparking: 'sparking at the brushes',
  'field-overheating': 'field coils too hot',
  'armature-overheating': 'armature or commutator too hot',
  'low-torque': 'cannot pull its load',
  'will-not-start': 'does not turn when started',
  'trips-overcurrent': 'trips on overcurrent',
  'trips-earth-fault': 'trips on earth fault',
  'noise-vibration': 'noisy or vibrating',
  'stops-after-running': 'stops after running a while',
  'will-not-stop': 'does not stop when told to',
  'blows-fuses-stopping': 'blows fuses when stopping or lowering',
  'brushes-wear-fast': 'brushes wear fast (without sparking)',
} as const;
export type Symptom = keyof typeof SYMPTOMS;
export const SYMPTOM_IDS = Object.keys(SYMPTOMS) as [Symptom, ...Symptom[]];

export const DRIVES = ['fixed-supply', 'controlled-converter', 'battery', 'unknown'] as const;
export const FEEDBACK = ['tacho', 'encoder', 'armature-voltage', 'none', 'unknown'] as const;
export const COOLING = ['self-ventilated', 'separately-ventilated', 'non-ventilated', 'unknown'] as const;

interface ObservationSpec {
  says: string;
  values: Record<string, string>;
}

/** Each observation, what it means, and the answers it takes (plus `unknown`). */
export const OBSERVATIONS = {
  'present-state': { says: 'what the machine is doing now', values: { running: 'running', stopped: 'stopped', tripped: 'tripped by its protection', isolated: 'isolated and locked off' } },
  'drive-fault-kind': { says: 'what the drive or protection displays', values: { none: 'no fault shown', overcurrent: 'overcurrent', overspeed: 'overspeed', 'field-loss': 'field loss', 'earth-fault': 'earth fault', 'feedback-loss': 'speed feedback lost', overtemperature: 'overtemperature', other: 'another fault' } },
  'recent-work': { says: 'work done on the machine or drive recently', values: { none: 'none', rewired: 'rewired or reconnected', 'brushes-replaced': 'brushes replaced', 'armature-rewound': 'armature rewound', 'commutator-machined': 'commutator machined', 'bearings-replaced': 'bearings replaced', 'drive-replaced': 'drive replaced or reprogrammed', other: 'other work' } },
  'leads-disturbed': { says: 'which terminations were re-made', values: { none: 'none', armature: 'armature (A1/A2)', 'shunt-field': 'shunt field (F1/F2)', 'series-field': 'series field (S1/S2)', interpole: 'interpole', tacho: 'tacho or encoder', several: 'several' } },
  'load-coupled': { says: 'the driven load is mechanically connected', values: { yes: 'yes', no: 'no' } },
  'load-kind': { says: 'what the machine drives', values: { general: 'a load that may run either way (general machinery)', hoisting: 'a hoist, crane or winch', incline: 'an inclined conveyor or ramp', 'non-reversible': 'a load that must not run backwards (backstop conveyor, pump, fan)', 'bench-test': 'nothing: on the bench, uncoupled on purpose for a test' } },
  'load-landed': { says: 'the load of a hoist or incline is landed or blocked', values: { yes: 'yes', no: 'no' } },
  'load-level': { says: 'how much load is on the machine', values: { none: 'none', light: 'light', normal: 'normal', heavy: 'heavy' } },
  'speed-with-load': { says: 'how speed changes as load comes on', values: { 'falls-slightly': 'falls slightly', 'falls-strongly': 'falls strongly', rises: 'rises', 'no-change': 'does not change' } },
  'supply-reversed': { says: 'the supply polarity was reversed to reverse the machine', values: { yes: 'yes', no: 'no' } },
  'direction-command': { says: "the drive's direction input or reference polarity", values: { normal: 'normal', reversed: 'reversed' } },
  'sparking-where': { says: 'where the sparking is', values: { 'all-brushes': 'all brushes', 'some-brushes': 'some brushes', 'one-spot-on-commutator': 'one spot on the commutator' } },
  'sparking-with-load': { says: 'how sparking changes with load', values: { 'grows-with-load': 'grows with load', constant: 'constant', 'only-at-start': 'only at start' } },
  'commutator-surface': { says: 'how the commutator looks', values: { 'even-film': 'even brown film', 'burnt-bars-regular-spacing': 'burnt bars at a regular spacing', 'grooved-or-rough': 'grooved or rough', 'raised-or-low-bars': 'raised or low bars', 'high-mica': 'high mica', 'blackened-patches': 'blackened patches', 'threading-or-streaking': 'threading or streaking: tracks cut in the film', 'copper-drag': 'copper dragged across the slots', 'contaminated-film': 'stained, sticky or patchy film (oil, silicone, fumes)', 'bare-copper': 'bright copper, little or no film' } },
  'brushes-free': { says: 'brushes slide freely in their holders', values: { yes: 'yes', no: 'no' } },
  'brush-grade-changed': { says: 'the brush grade was changed', values: { yes: 'yes', no: 'no' } },
  'neutral-marks-aligned': { says: 'brush-gear position marks line up', values: { yes: 'yes', no: 'no' } },
  'bar-to-bar-test': { says: 'bar-to-bar resistance test result', values: { even: 'even', 'one-high': 'one reading high', 'one-low': 'one reading low' } },
  'field-coils-equal': { says: 'voltage drops across the field coils agree', values: { yes: 'yes', no: 'no' } },
  'hot-while-stopped': { says: 'the field got hot standing energised with the machine stopped', values: { yes: 'yes', no: 'no' } },
  'cooling-air': { says: 'cooling air flow', values: { normal: 'normal', low: 'low', none: 'none' } },
  'turns-freely': { says: 'isolated and uncoupled, the shaft turns freely by hand', values: { yes: 'yes', no: 'no' } },
  'bearing-noise': { says: 'bearing noise', values: { yes: 'yes', no: 'no' } },
  'tacho-signal': { says: 'the tacho or encoder signal', values: { 'follows-speed': 'follows speed', absent: 'absent', reversed: 'reversed', erratic: 'jumps about or drops out' } },
  'current-at-limit': { says: 'the drive shows it is holding current at its limit', values: { yes: 'yes', no: 'no' } },
  'current-ripple': { says: 'ripple on the armature current or voltage', values: { normal: 'normal', high: 'high, or a missing pulse' } },
  'trips-when': { says: 'when it trips', values: { 'at-start': 'at start', 'under-load': 'under load', random: 'at random' } },
  'air-conditions': { says: 'the air the machine breathes', values: { normal: 'normal', 'very-dry': 'very dry (heated building in winter, dry climate)', contaminated: 'oil mist, silicone vapour or chemical fumes' } },
  'brush-shunts': { says: 'the brush shunts (pigtails) and their connections', values: { sound: 'sound', 'broken-or-burnt': 'one or more broken, frayed, burnt or loose' } },
  'starter-step': { says: 'which step the armature starter is on when running', values: { 'first-step': 'the first step (all resistance in)', intermediate: 'an intermediate step', run: 'run: every step cut out' } },
  'resistor-grid': { says: 'the starting or braking resistor grid', values: { normal: 'normal', hot: 'hot or discoloured after running', 'open-or-burnt': 'open, burnt through or broken' } },
  'test-lamp': { says: 'a test lamp or continuity tester across the circuit under test', values: { lights: 'lights: the circuit is continuous', dark: 'stays dark: the circuit is open' } },
  'growler-test': { says: 'growler test on the armature (a hacksaw blade over each slot)', values: { 'no-short': 'blade quiet on every slot', 'shorted-coil': 'blade vibrates over one or more slots' } },
  'contactor-opens': { says: 'the main or braking contactor opens when the stop is given', values: { yes: 'yes', 'stays-closed': 'stays closed or its contacts are welded' } },
  'ac-supply-phases': { says: "the converter's AC supply, phase to phase", values: { balanced: 'all three present and equal', 'phase-missing': 'one phase or line fuse missing', dips: 'dips or interruptions on the mains' } },
  'braking-resistor': { says: 'the dynamic-braking resistor', values: { 'as-rated': 'at its rated resistance', open: 'open', shorted: 'shorted or low' } },
  'brake-lifts': { says: 'the mechanical brake lifts clear when the machine runs', values: { yes: 'yes', no: 'no, or drags' } },
  'protection-test': { says: 'the protective device under test (field-failure relay, overspeed switch, thermostat, airflow switch)', values: { correct: 'operates at its setting', 'trips-early': 'trips for nothing or below its setting', 'fails-to-trip': 'does not operate' } },
  'drive-train': { says: 'the coupling, key, belts and gearing', values: { sound: 'sound and aligned', 'slipping-or-sheared': 'a belt slipping, a coupling or key sheared', misaligned: 'misaligned or out of balance', 'ratio-changed': 'a different gear or pulley ratio from the record' } },
  'rubbing-marks': { says: 'rub marks on the armature or pole faces', values: { yes: 'yes', no: 'no' } },
  'back-emf-constant': { says: 'volts per 1000 r/min generated uncoupled, against the plate', values: { 'as-plate': 'as the plate', 'below-plate': 'clearly below the plate' } },
  'compensating-winding': { says: 'the compensating winding against the diagram', values: { correct: 'correct', 'reversed-or-shorted': 'reversed or shorted' } },
  'interpole-gap': { says: 'interpole air gaps and shims against the record', values: { 'as-record': 'as the record', differs: 'different from the record' } },
  'field-ripple': { says: 'the field current waveform from its rectifier', values: { normal: 'normal full-wave', 'half-wave': 'half-wave: one rectifier diode open' } },
  'duty-profile': { says: 'how the machine is worked', values: { continuous: 'steady running', 'frequent-starts': 'frequent starts, reversals or plugging', 'long-slow-running': 'long periods well below base speed' } },
  'rms-current': { says: 'the RMS armature current over a whole duty cycle, against the rated current', values: { 'within-rating': 'within rating', 'above-rating': 'above rating' } },
  'flash-marks': { says: 'arc marks across the commutator or between brush arms', values: { yes: 'yes', no: 'no' } },
  'battery-on-load': { says: 'the battery voltage as load comes on', values: { holds: 'holds up', collapses: 'collapses, or one cell or link reads far off the rest' } },
  'wiring-check': { says: 'the wiring rung out point to point against the diagram', values: { matches: 'matches the diagram', differs: 'differs from the diagram', 'short-found': 'a short circuit outside the machine' } },
  'drive-parameters': { says: "the drive's parameters against the commissioning record", values: { 'match-record': 'match the record', 'differ-from-record': 'differ from the record or are at factory defaults' } },
} as const satisfies Record<string, ObservationSpec>;

export type ObservationName = keyof typeof OBSERVATIONS;
export const OBSERVATION_NAMES = Object.keys(OBSERVATIONS) as [ObservationName, ...ObservationName[]];

/** Answers an observation takes, `unknown` included. */
export function observationValues(name: ObservationName): [string, ...string[]] {
  return ['unknown', ...Object.keys(OBSERVATIONS[name].values)];
}
