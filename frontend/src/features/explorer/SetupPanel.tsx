import { memo, useLayoutEffect, useMemo, useState, type CSSProperties } from 'react';
import { Button, ConfigProvider, Divider, Form, Input, Segmented, Select, Space, Tooltip, Typography } from 'antd';
import { DeleteOutlined, PlusOutlined } from '@ant-design/icons';
import { SETUP_LIMITS, SETUP_PRESETS, applyPreset, type AlphaUnit, type DisplayEnergyUnit, type FieldUnit, type IonMotion, type SetupIssue } from '@fieldbound/shared';
import {
  ALPHA_UNIT_LABEL, ENERGY_UNIT_LABEL, FIELD_UNIT_LABEL, alphaFromDisplay, alphaToDisplay, displayToKelvin, fieldDisplayToTesla,
  fieldTeslaToDisplay, kelvinToDisplay,
} from '../map-render/displayUnits';
import { formatScientific, parseScientific } from '../map-render/formatNumber';
import { getIn, type SetupDraft } from './setupDraft';
import { SetupFormStore, SetupFormStoreContext, useDraftSetter, useDraftSlice, useIssueText, useSetupFormStore } from './setupFormStore';
import { UnitNumberInput } from './UnitNumberInput';
import { shownKey } from './viewState';
import { MagnetSafetyNote } from '../../components/MagnetSafetyNote';

export interface SetupPanelProps {
  draft: SetupDraft;
  issues: readonly SetupIssue[];
  onChange: (draft: SetupDraft) => void;
  /** Start the computation of the draft (enabled when it is valid and changes what the engine computes). */
  onCompute: () => void;
  needsCompute: boolean;
  /** Optional seam for saving (the saved-maps feature plugs in here). */
  onSave?: () => void;
  saveLabel?: string;
  /** Species the overlay can mark (value: the name stored in the setup). Without it the species field is hidden. */
  speciesOptions?: readonly { value: string; label: string }[];
}

/**
 * The setup of a map: ranges and scales, grid, orbitals, cutoff, ion motion, contours and display units; then Compute
 * and Save. The form's layout renders once; each field reads its own slice of the draft and its own messages from
 * a store that mirrors the props, so a keystroke re-renders the field typed in, the fields whose value or messages
 * changed, and the buttons when what they show changes — never the whole form.
 */
export const SetupPanel = memo(function SetupPanel({ draft, issues, onChange, onCompute, needsCompute, onSave, saveLabel, speciesOptions }: SetupPanelProps) {
  const [store] = useState(() => new SetupFormStore({ draft, issues }, onChange));
  // After the commit that brought new props, in the same task (before paint): the subscribed fields re-render.
  useLayoutEffect(() => store.publish({ draft, issues }, onChange), [store, draft, issues, onChange]);
  return (
    <SetupFormStoreContext.Provider value={store}>
      <SetupFields />
      {speciesOptions && <SpeciesField speciesOptions={speciesOptions} />}
      <SetupActions onCompute={onCompute} needsCompute={needsCompute} onSave={onSave} saveLabel={saveLabel} issueCount={issues.length} />
    </SetupFormStoreContext.Provider>
  );
});

const SetupActions = memo(function SetupActions({ onCompute, needsCompute, onSave, saveLabel, issueCount }: Pick<SetupPanelProps, 'onCompute' | 'needsCompute' | 'onSave' | 'saveLabel'> & { issueCount: number }) {
  return (
    <Space style={{ marginTop: 16, width: '100%' }} orientation="vertical">
      {/* No click wave: its extra React root and animation land on the main thread just as a computation starts. */}
      <ConfigProvider wave={{ disabled: true }}>
        <Button type="primary" block disabled={!needsCompute} onClick={onCompute}>
          Compute
        </Button>
      </ConfigProvider>
      {onSave && (
        <Button block onClick={onSave} disabled={issueCount > 0}>
          {saveLabel ?? 'Save setup'}
        </Button>
      )}
      {issueCount > 0 && (
        <Typography.Text type="danger" style={{ fontSize: 12 }}>
          {issueCount === 1 ? 'One setting needs attention.' : `${issueCount} settings need attention.`}
        </Typography.Text>
      )}
    </Space>
  );
});

// ---- Units: one conversion object per unit (module constants), so a field's props stay equal across renders.

interface Conversion {
  toDisplay: (canonical: number) => number;
  fromDisplay: (shown: number) => number;
  suffix: string;
}
type UnitKind = 'alpha' | 'field' | 'energy';

function conversions<U extends string>(labels: Record<U, string>, toDisplay: (x: number, unit: U) => number, fromDisplay: (x: number, unit: U) => number): Record<U, Conversion> {
  const out = {} as Record<U, Conversion>;
  for (const unit of Object.keys(labels) as U[]) out[unit] = { toDisplay: (x) => toDisplay(x, unit), fromDisplay: (x) => fromDisplay(x, unit), suffix: labels[unit] };
  return out;
}

const CONVERSIONS: Record<UnitKind, Record<string, Conversion>> = {
  alpha: conversions<AlphaUnit>(ALPHA_UNIT_LABEL, alphaToDisplay, alphaFromDisplay),
  field: conversions<FieldUnit>(FIELD_UNIT_LABEL, fieldTeslaToDisplay, fieldDisplayToTesla),
  energy: conversions<DisplayEnergyUnit>(ENERGY_UNIT_LABEL, kelvinToDisplay, displayToKelvin),
};

function useConversion(kind: UnitKind | undefined): Conversion | undefined {
  const unit = useDraftSlice((d) => (kind === 'alpha' ? d.display.alphaUnit : kind === 'field' ? d.display.fieldUnit : kind === 'energy' ? d.display.energyUnit : null));
  return kind && unit ? CONVERSIONS[kind][unit] : undefined;
}

// ---- Fields

const ITEM_STYLE: CSSProperties = { marginBottom: 10 };
const HALF_WIDTH: CSSProperties = { width: '55%' };

interface NumberFieldProps {
  label: string;
  /** Dotted path in the setup ("alphaAxis.min"); also where the setup rules put its messages. */
  path: string;
  /** Shown in the display unit of this kind (the field follows the unit chosen); otherwise as stored, with `suffix`. */
  unit?: UnitKind;
  suffix?: string;
  integer?: boolean;
  testId?: string;
}

/**
 * A number in the chosen unit; stores the canonical value (shown to 6 significant figures, replaced only when the
 * person types); shows the setup rules' messages beside it.
 */
const NumberField = memo(function NumberField({ label, path, unit, suffix, integer, testId }: NumberFieldProps) {
  const value = useDraftSlice((d) => getIn(d, path) as number | undefined);
  const help = useIssueText(path);
  const onChange = useDraftSetter(path);
  const conv = useConversion(unit);
  return (
    <Form.Item label={label} validateStatus={help ? 'error' : undefined} help={help || undefined} style={ITEM_STYLE}>
      <UnitNumberInput value={value} toDisplay={conv?.toDisplay} fromDisplay={conv?.fromDisplay} onChange={onChange} suffix={conv?.suffix ?? suffix} integer={integer} data-testid={testId} aria-label={label} />
    </Form.Item>
  );
});

const MOTION_OPTIONS: { value: IonMotion['kind']; label: string }[] = [
  { value: 'none', label: 'None (atom held fixed)' },
  { value: 'kinetic-energy', label: 'Transverse kinetic energy' },
  { value: 'ion-level', label: 'Ion Landau level' },
  { value: 'temperature', label: 'Temperature' },
];

function motionDefault(kind: IonMotion['kind']): IonMotion {
  switch (kind) {
    case 'kinetic-energy':
      return { kind, energyKelvin: 1 };
    case 'ion-level':
      return { kind, level: 0 };
    case 'temperature':
      return { kind, kelvin: 1 };
    default:
      return { kind: 'none' };
  }
}

/** Contour levels typed as a list in the chosen energy unit ("0.1, 1, 10"); stored in kelvin. */
function parseLevels(text: string, unit: DisplayEnergyUnit): number[] {
  return text
    .split(/[,;]/)
    .filter((t) => t.trim() !== '')
    .map((t) => {
      const v = parseScientific(t);
      return Number.isFinite(v) ? displayToKelvin(v, unit) : Number.NaN;
    });
}

function Section({ title }: { title: string }) {
  return (
    <Divider titlePlacement="start" plain style={{ margin: '10px 0 8px' }}>
      <Typography.Text strong style={{ fontSize: 12, letterSpacing: 0.3 }}>
        {title}
      </Typography.Text>
    </Divider>
  );
}

const PRESET_OPTIONS = SETUP_PRESETS.map((p) => ({ value: p.id, label: <Tooltip title={p.description}>{p.title}</Tooltip> }));

const PresetField = memo(function PresetField() {
  const store = useSetupFormStore();
  return (
    <Form.Item label="Preset ranges" style={{ marginBottom: 8 }}>
      <Select
        placeholder="Fill the ranges for a regime…"
        value={null}
        onChange={(id) => {
          const preset = SETUP_PRESETS.find((p) => p.id === id);
          if (preset) store.replace(applyPreset(store.draft(), preset));
        }}
        options={PRESET_OPTIONS}
      />
    </Form.Item>
  );
});

const ALPHA_UNIT_OPTIONS = (Object.keys(ALPHA_UNIT_LABEL) as AlphaUnit[]).map((u) => ({ value: u, label: ALPHA_UNIT_LABEL[u] }));
const FIELD_UNIT_OPTIONS = (Object.keys(FIELD_UNIT_LABEL) as FieldUnit[]).map((u) => ({ value: u, label: u === 'au' ? 'atomic units (2.35 × 10⁵ T)' : 'tesla' }));
const SCALE_OPTIONS = [
  { value: 'log', label: 'log' },
  { value: 'linear', label: 'linear' },
];

/** An axis's unit and scale (log / linear), on one line above its range. */
const AxisUnitAndScale = memo(function AxisUnitAndScale({ axis }: { axis: 'alpha' | 'field' }) {
  const unit = useDraftSlice((d) => (axis === 'alpha' ? d.display.alphaUnit : d.display.fieldUnit));
  const scale = useDraftSlice((d) => (axis === 'alpha' ? d.alphaAxis.scale : d.fieldAxis.scale));
  const setUnit = useDraftSetter(axis === 'alpha' ? 'display.alphaUnit' : 'display.fieldUnit');
  const setScale = useDraftSetter(axis === 'alpha' ? 'alphaAxis.scale' : 'fieldAxis.scale');
  return (
    <Space.Compact block style={{ marginBottom: 8 }}>
      <Select<string> aria-label={axis === 'alpha' ? 'Polarizability unit' : 'Field unit'} value={unit} onChange={setUnit} options={axis === 'alpha' ? ALPHA_UNIT_OPTIONS : FIELD_UNIT_OPTIONS} style={HALF_WIDTH} />
      <Segmented size="small" value={scale} onChange={setScale} options={SCALE_OPTIONS} />
    </Space.Compact>
  );
});

/** The ion's motion: its kind, and the one number that kind takes. */
const MotionFields = memo(function MotionFields() {
  const kind = useDraftSlice((d) => d.motion.kind);
  const setMotion = useDraftSetter('motion');
  return (
    <>
      <Form.Item label="Ion motion" style={ITEM_STYLE}>
        <Select aria-label="Ion motion" value={kind} onChange={(k: IonMotion['kind']) => setMotion(motionDefault(k))} options={MOTION_OPTIONS} />
      </Form.Item>
      {kind === 'kinetic-energy' && <NumberField label="Transverse kinetic energy" path="motion.energyKelvin" unit="energy" />}
      {kind === 'ion-level' && <NumberField label="Ion Landau level N" path="motion.level" integer />}
      {kind === 'temperature' && <NumberField label="Temperature" path="motion.kelvin" suffix="K" />}
    </>
  );
});

const ENERGY_UNIT_OPTIONS = (Object.keys(ENERGY_UNIT_LABEL) as DisplayEnergyUnit[]).map((u) => ({ value: u, label: ENERGY_UNIT_LABEL[u] }));

const EnergyUnitField = memo(function EnergyUnitField() {
  const energyUnit = useDraftSlice((d) => d.display.energyUnit);
  const setUnit = useDraftSetter('display.energyUnit');
  return (
    <Form.Item label="Energy unit" style={ITEM_STYLE}>
      <Segmented block size="small" value={energyUnit} onChange={setUnit} options={ENERGY_UNIT_OPTIONS} />
    </Form.Item>
  );
});

const ShownField = memo(function ShownField() {
  const valueKey = useDraftSlice((d) => shownKey(d.display.shown));
  // Orbitals offered: those of the draft's highest orbital (none past the limit; m = 0 while it is being typed).
  const orbitals = useDraftSlice((d) => Math.max(0, Math.min(SETUP_LIMITS.maxOrbital, Number.isInteger(d.orbitals.mMax) ? d.orbitals.mMax : 0)) + 1);
  const help = useIssueText('display.shown');
  const setShown = useDraftSetter('display.shown');
  const options = useMemo(
    () => [...Array.from({ length: orbitals }, (_, m) => ({ value: `m${m}`, label: `Orbital m = ${m}` })), { value: 'survivors', label: 'Survivors (number of states)' }],
    [orbitals],
  );
  return (
    <Form.Item label="Regions show" validateStatus={help ? 'error' : undefined} help={help || undefined} style={ITEM_STYLE}>
      <Select aria-label="Regions show" value={valueKey} onChange={(v: string) => setShown(v === 'survivors' ? { kind: 'survivors' } : { kind: 'orbital', m: Number(v.slice(1)) })} options={options} />
    </Form.Item>
  );
});

const ContoursField = memo(function ContoursField() {
  const levelsKelvin = useDraftSlice((d) => d.contours.levelsKelvin);
  const energyUnit = useDraftSlice((d) => d.display.energyUnit);
  const help = useIssueText('contours');
  const setLevels = useDraftSetter('contours.levelsKelvin');
  const levelsText = useMemo(() => levelsKelvin.map((k) => (Number.isFinite(k) ? formatScientific(kelvinToDisplay(k, energyUnit), { digits: 4 }) : '?')).join(', '), [levelsKelvin, energyUnit]);
  // Unchanged text keeps the stored levels exactly (the shown text is rounded to 4 figures).
  const commit = (text: string) => text !== levelsText && setLevels(parseLevels(text, energyUnit));
  return (
    <Form.Item label={`Binding-energy contours (${ENERGY_UNIT_LABEL[energyUnit]}, separated by commas)`} validateStatus={help ? 'error' : undefined} help={help || undefined} style={ITEM_STYLE}>
      <Input key={`${energyUnit}:${levelsText}`} aria-label="Binding-energy contours" defaultValue={levelsText} onBlur={(e) => commit(e.target.value)} onPressEnter={(e) => commit((e.target as HTMLInputElement).value)} />
    </Form.Item>
  );
});

const FieldBandRow = memo(function FieldBandRow({ index }: { index: number }) {
  const band = useDraftSlice((d) => d.fieldBands[index]);
  const conv = useConversion('field');
  const help = useIssueText(`fieldBands.${index}`);
  const setLabel = useDraftSetter(`fieldBands.${index}.label`);
  const setMin = useDraftSetter(`fieldBands.${index}.minTesla`);
  const setMax = useDraftSetter(`fieldBands.${index}.maxTesla`);
  const store = useSetupFormStore();
  if (!band) return null;
  const n = index + 1;
  return (
    <Space.Compact block style={{ marginBottom: 4 }}>
      <Form.Item validateStatus={help ? 'error' : undefined} help={help || undefined} style={{ marginBottom: 4, width: '100%' }}>
        <Space.Compact block>
          <Input aria-label={`Field band ${n} label`} value={band.label} onChange={(e) => setLabel(e.target.value)} style={{ width: '40%' }} />
          <UnitNumberInput aria-label={`Field band ${n} from`} value={band.minTesla} toDisplay={conv?.toDisplay} fromDisplay={conv?.fromDisplay} onChange={setMin} style={{ width: '25%' }} />
          <UnitNumberInput aria-label={`Field band ${n} to`} value={band.maxTesla} toDisplay={conv?.toDisplay} fromDisplay={conv?.fromDisplay} onChange={setMax} style={{ width: '25%' }} />
          <Button aria-label={`Remove field band ${n}`} icon={<DeleteOutlined />} onClick={() => store.set(['fieldBands'], store.draft().fieldBands.filter((_, j) => j !== index))} />
        </Space.Compact>
      </Form.Item>
    </Space.Compact>
  );
});

const FieldBands = memo(function FieldBands() {
  const count = useDraftSlice((d) => d.fieldBands.length);
  const fieldUnit = useDraftSlice((d) => d.display.fieldUnit);
  const store = useSetupFormStore();
  const addBand = () => {
    const d = store.draft();
    store.set(['fieldBands'], [...d.fieldBands, { label: `Band ${d.fieldBands.length + 1}`, minTesla: d.fieldAxis.min, maxTesla: Math.sqrt(d.fieldAxis.min * d.fieldAxis.max) }]);
  };
  return (
    <>
      {Array.from({ length: count }, (_, k) => (
        <FieldBandRow key={k} index={k} />
      ))}
      <Button size="small" icon={<PlusOutlined />} disabled={count >= SETUP_LIMITS.maxFieldBands} onClick={addBand}>
        Add field band ({FIELD_UNIT_LABEL[fieldUnit]})
      </Button>
    </>
  );
});

/** The safety note, while the setup is about laboratory fields (field bands, or fields from 100 T down). */
const SafetyNoteSlot = memo(function SafetyNoteSlot() {
  const shown = useDraftSlice((d) => d.fieldBands.length > 0 || d.fieldAxis.min <= 100);
  return shown ? (
    <div style={{ marginTop: 8 }}>
      <MagnetSafetyNote compact />
    </div>
  ) : null;
});

/** The form's layout: it reads nothing of the draft itself, so it renders once. */
const SetupFields = memo(function SetupFields() {
  return (
    <Form layout="vertical" size="small" requiredMark={false} aria-label="Map setup">
      <PresetField />

      <Section title="Polarizability α (horizontal)" />
      <AxisUnitAndScale axis="alpha" />
      <Space.Compact block>
        <NumberField label="from" path="alphaAxis.min" unit="alpha" testId="alpha-min" />
        <NumberField label="to" path="alphaAxis.max" unit="alpha" testId="alpha-max" />
      </Space.Compact>

      <Section title="Magnetic field B (vertical)" />
      <AxisUnitAndScale axis="field" />
      <Space.Compact block>
        <NumberField label="from" path="fieldAxis.min" unit="field" testId="field-min" />
        <NumberField label="to" path="fieldAxis.max" unit="field" testId="field-max" />
      </Space.Compact>

      <Section title="Computation" />
      <Space.Compact block>
        <NumberField label="Columns (α)" path="grid.nAlpha" integer />
        <NumberField label="Rows (B)" path="grid.nField" integer />
      </Space.Compact>
      <NumberField label="Highest orbital m" path="orbitals.mMax" integer />
      <NumberField label="Cutoff radius r_c (regularized polarization potential)" path="shortRange.cutoffBohr" suffix="a₀" />
      <NumberField label="Energy floor (weaker binding counts as unbound)" path="energyFloorKelvin" unit="energy" />

      <Section title="Ion motion" />
      <MotionFields />
      <Space.Compact block>
        <NumberField label="Ion mass number" path="ion.massNumber" integer />
        <NumberField label="Observation time" path="observationTimeSeconds" suffix="s" />
      </Space.Compact>

      <Section title="Display" />
      <EnergyUnitField />
      <ShownField />
      <ContoursField />

      <Section title="Field bands" />
      <FieldBands />
      <SafetyNoteSlot />
    </Form>
  );
});

/**
 * The species of the overlay, in a form of its own after the other fields: the catalogue arrives after the page
 * opens (and may change), which then re-renders this one field rather than the whole setup form.
 */
const SpeciesField = memo(function SpeciesField({ speciesOptions }: { speciesOptions: NonNullable<SetupPanelProps['speciesOptions']> }) {
  const species = useDraftSlice((d) => d.species);
  const help = useIssueText('species');
  const setSpecies = useDraftSetter('species');
  const options = useMemo(() => speciesOptions.map((o) => ({ value: o.value, label: o.label })), [speciesOptions]);
  return (
    <Form layout="vertical" size="small" requiredMark={false} aria-label="Species of the map">
      <Section title="Species on the map" />
      <Form.Item validateStatus={help ? 'error' : undefined} help={help || undefined} style={ITEM_STYLE}>
        <Select mode="multiple" aria-label="Species on the map" placeholder="Mark atoms at their polarizability…" value={species} onChange={setSpecies} options={options} optionFilterProp="label" maxTagCount={12} />
      </Form.Item>
    </Form>
  );
});
