import { memo, useMemo, type ReactNode } from 'react';
import { Button, ConfigProvider, Divider, Form, Input, Segmented, Select, Space, Tooltip, Typography } from 'antd';
import { DeleteOutlined, PlusOutlined } from '@ant-design/icons';
import { SETUP_LIMITS, SETUP_PRESETS, applyPreset, type AlphaUnit, type DisplayEnergyUnit, type FieldUnit, type IonMotion, type SetupIssue } from '@fieldbound/shared';
import {
  ALPHA_UNIT_LABEL, ENERGY_UNIT_LABEL, FIELD_UNIT_LABEL, alphaFromDisplay, alphaToDisplay, displayToKelvin, fieldDisplayToTesla,
  fieldTeslaToDisplay, kelvinToDisplay,
} from '../map-render/displayUnits';
import { formatScientific, parseScientific } from '../map-render/formatNumber';
import { issuesAt, setIn, type SetupDraft } from './setupDraft';
import { UnitNumberInput } from './UnitNumberInput';
import { MagnetSafetyNote } from '../../components/MagnetSafetyNote';


interface NumberFieldProps {
  label: ReactNode;
  path: string;
  issues: readonly SetupIssue[];
  value: number | undefined;
  toDisplay?: (canonical: number) => number;
  fromDisplay?: (shown: number) => number;
  onChange: (canonical: number | undefined) => void;
  suffix?: string;
  integer?: boolean;
  testId?: string;
}

/**
 * A number in the chosen unit; stores the canonical value (shown to 6 significant figures, replaced only when the
 * person types); shows the setup rules' messages beside it.
 */
function NumberField({ label, path, issues, value, toDisplay, fromDisplay, onChange, suffix, integer, testId }: NumberFieldProps) {
  const messages = issuesAt(issues, path);
  return (
    <Form.Item label={label} validateStatus={messages.length ? 'error' : undefined} help={messages.length ? messages.join('; ') : undefined} style={{ marginBottom: 10 }}>
      <UnitNumberInput value={value} toDisplay={toDisplay} fromDisplay={fromDisplay} onChange={onChange} suffix={suffix} integer={integer} data-testid={testId} aria-label={typeof label === 'string' ? label : path} />
    </Form.Item>
  );
}

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

/**
 * The setup of a map: ranges and scales, grid, orbitals, cutoff, ion motion, contours and display units; then Compute
 * and Save. The fields (the antd form) are a memoised part of their own, outside which the buttons sit: pressing
 * Compute re-renders only the buttons, never the form's items, which take longer than a frame.
 */
export const SetupPanel = memo(function SetupPanel({ draft, issues, onChange, onCompute, needsCompute, onSave, saveLabel, speciesOptions }: SetupPanelProps) {
  return (
    <>
      <SetupFields draft={draft} issues={issues} onChange={onChange} />
      {speciesOptions && <SpeciesField draft={draft} issues={issues} onChange={onChange} speciesOptions={speciesOptions} />}
      <Space style={{ marginTop: 16, width: '100%' }} orientation="vertical">
        {/* No click wave: its extra React root and animation land on the main thread just as a computation starts. */}
        <ConfigProvider wave={{ disabled: true }}>
          <Button type="primary" block disabled={!needsCompute} onClick={onCompute}>
            Compute
          </Button>
        </ConfigProvider>
        {onSave && (
          <Button block onClick={onSave} disabled={issues.length > 0}>
            {saveLabel ?? 'Save setup'}
          </Button>
        )}
        {issues.length > 0 && (
          <Typography.Text type="danger" style={{ fontSize: 12 }}>
            {issues.length === 1 ? 'One setting needs attention.' : `${issues.length} settings need attention.`}
          </Typography.Text>
        )}
      </Space>
    </>
  );
});

type SetupFieldsProps = Pick<SetupPanelProps, 'draft' | 'issues' | 'onChange'>;

const SetupFields = memo(function SetupFields({ draft, issues, onChange }: SetupFieldsProps) {
  const set = (path: (string | number)[]) => (value: unknown) => onChange(setIn(draft, path, value));
  const { alphaUnit, fieldUnit, energyUnit } = draft.display;
  const aLabel = ALPHA_UNIT_LABEL[alphaUnit];
  const bLabel = FIELD_UNIT_LABEL[fieldUnit];
  const eLabel = ENERGY_UNIT_LABEL[energyUnit];
  const alphaConv = { toDisplay: (x: number) => alphaToDisplay(x, alphaUnit), fromDisplay: (x: number) => alphaFromDisplay(x, alphaUnit), suffix: aLabel };
  const fieldConv = { toDisplay: (x: number) => fieldTeslaToDisplay(x, fieldUnit), fromDisplay: (x: number) => fieldDisplayToTesla(x, fieldUnit), suffix: bLabel };
  const energyConv = { toDisplay: (x: number) => kelvinToDisplay(x, energyUnit), fromDisplay: (x: number) => displayToKelvin(x, energyUnit), suffix: eLabel };
  const levelsText = useMemo(
    () => draft.contours.levelsKelvin.map((k) => (Number.isFinite(k) ? formatScientific(kelvinToDisplay(k, energyUnit), { digits: 4 }) : '?')).join(', '),
    [draft.contours.levelsKelvin, energyUnit],
  );
  const motion = draft.motion;
  const levelMessages = issuesAt(issues, 'contours');
  const shownValueKey = draft.display.shown.kind === 'survivors' ? 'survivors' : `m${draft.display.shown.m}`;

  return (
    <Form layout="vertical" size="small" requiredMark={false} aria-label="Map setup">
      <Form.Item label="Preset ranges" style={{ marginBottom: 8 }}>
        <Select
          placeholder="Fill the ranges for a regime…"
          value={null}
          onChange={(id) => {
            const preset = SETUP_PRESETS.find((p) => p.id === id);
            if (preset) onChange(applyPreset(draft, preset));
          }}
          options={SETUP_PRESETS.map((p) => ({ value: p.id, label: <Tooltip title={p.description}>{p.title}</Tooltip> }))}
        />
      </Form.Item>

      <Section title="Polarizability α (horizontal)" />
      <Space.Compact block style={{ marginBottom: 8 }}>
        <Select<AlphaUnit>
          aria-label="Polarizability unit"
          value={alphaUnit}
          onChange={set(['display', 'alphaUnit'])}
          options={(Object.keys(ALPHA_UNIT_LABEL) as AlphaUnit[]).map((u) => ({ value: u, label: ALPHA_UNIT_LABEL[u] }))}
          style={{ width: '55%' }}
        />
        <Segmented size="small" value={draft.alphaAxis.scale} onChange={(v) => set(['alphaAxis', 'scale'])(v)} options={[{ value: 'log', label: 'log' }, { value: 'linear', label: 'linear' }]} />
      </Space.Compact>
      <Space.Compact block>
        <NumberField label="from" path="alphaAxis.min" issues={issues} value={draft.alphaAxis.min} onChange={set(['alphaAxis', 'min'])} {...alphaConv} testId="alpha-min" />
        <NumberField label="to" path="alphaAxis.max" issues={issues} value={draft.alphaAxis.max} onChange={set(['alphaAxis', 'max'])} {...alphaConv} testId="alpha-max" />
      </Space.Compact>

      <Section title="Magnetic field B (vertical)" />
      <Space.Compact block style={{ marginBottom: 8 }}>
        <Select<FieldUnit>
          aria-label="Field unit"
          value={fieldUnit}
          onChange={set(['display', 'fieldUnit'])}
          options={(Object.keys(FIELD_UNIT_LABEL) as FieldUnit[]).map((u) => ({ value: u, label: u === 'au' ? 'atomic units (2.35 × 10⁵ T)' : 'tesla' }))}
          style={{ width: '55%' }}
        />
        <Segmented size="small" value={draft.fieldAxis.scale} onChange={(v) => set(['fieldAxis', 'scale'])(v)} options={[{ value: 'log', label: 'log' }, { value: 'linear', label: 'linear' }]} />
      </Space.Compact>
      <Space.Compact block>
        <NumberField label="from" path="fieldAxis.min" issues={issues} value={draft.fieldAxis.min} onChange={set(['fieldAxis', 'min'])} {...fieldConv} testId="field-min" />
        <NumberField label="to" path="fieldAxis.max" issues={issues} value={draft.fieldAxis.max} onChange={set(['fieldAxis', 'max'])} {...fieldConv} testId="field-max" />
      </Space.Compact>

      <Section title="Computation" />
      <Space.Compact block>
        <NumberField label="Columns (α)" path="grid.nAlpha" issues={issues} value={draft.grid.nAlpha} onChange={set(['grid', 'nAlpha'])} integer />
        <NumberField label="Rows (B)" path="grid.nField" issues={issues} value={draft.grid.nField} onChange={set(['grid', 'nField'])} integer />
      </Space.Compact>
      <NumberField label="Highest orbital m" path="orbitals.mMax" issues={issues} value={draft.orbitals.mMax} onChange={set(['orbitals', 'mMax'])} integer />
      <NumberField label="Cutoff radius r_c (regularized polarization potential)" path="shortRange.cutoffBohr" issues={issues} value={draft.shortRange.cutoffBohr} onChange={set(['shortRange', 'cutoffBohr'])} suffix="a₀" />
      <NumberField label="Energy floor (weaker binding counts as unbound)" path="energyFloorKelvin" issues={issues} value={draft.energyFloorKelvin} onChange={set(['energyFloorKelvin'])} {...energyConv} />

      <Section title="Ion motion" />
      <Form.Item label="Ion motion" style={{ marginBottom: 10 }}>
        <Select aria-label="Ion motion" value={motion.kind} onChange={(kind) => set(['motion'])(motionDefault(kind))} options={MOTION_OPTIONS} />
      </Form.Item>
      {motion.kind === 'kinetic-energy' && (
        <NumberField label="Transverse kinetic energy" path="motion.energyKelvin" issues={issues} value={motion.energyKelvin} onChange={set(['motion', 'energyKelvin'])} {...energyConv} />
      )}
      {motion.kind === 'ion-level' && <NumberField label="Ion Landau level N" path="motion.level" issues={issues} value={motion.level} onChange={set(['motion', 'level'])} integer />}
      {motion.kind === 'temperature' && <NumberField label="Temperature" path="motion.kelvin" issues={issues} value={motion.kelvin} onChange={set(['motion', 'kelvin'])} suffix="K" />}
      <Space.Compact block>
        <NumberField label="Ion mass number" path="ion.massNumber" issues={issues} value={draft.ion.massNumber} onChange={set(['ion', 'massNumber'])} integer />
        <NumberField label="Observation time" path="observationTimeSeconds" issues={issues} value={draft.observationTimeSeconds} onChange={set(['observationTimeSeconds'])} suffix="s" />
      </Space.Compact>

      <Section title="Display" />
      <Form.Item label="Energy unit" style={{ marginBottom: 10 }}>
        <Segmented
          block
          size="small"
          value={energyUnit}
          onChange={(v) => set(['display', 'energyUnit'])(v)}
          options={(Object.keys(ENERGY_UNIT_LABEL) as DisplayEnergyUnit[]).map((u) => ({ value: u, label: ENERGY_UNIT_LABEL[u] }))}
        />
      </Form.Item>
      <Form.Item label="Regions show" validateStatus={issuesAt(issues, 'display.shown').length ? 'error' : undefined} help={issuesAt(issues, 'display.shown').join('; ') || undefined} style={{ marginBottom: 10 }}>
        <Select
          aria-label="Regions show"
          value={shownValueKey}
          onChange={(v: string) => set(['display', 'shown'])(v === 'survivors' ? { kind: 'survivors' } : { kind: 'orbital', m: Number(v.slice(1)) })}
          options={[
            ...Array.from({ length: Math.max(0, Math.min(SETUP_LIMITS.maxOrbital, Number.isInteger(draft.orbitals.mMax) ? draft.orbitals.mMax : 0)) + 1 }, (_, m) => ({ value: `m${m}`, label: `Orbital m = ${m}` })),
            { value: 'survivors', label: 'Survivors (number of states)' },
          ]}
        />
      </Form.Item>
      <Form.Item
        label={`Binding-energy contours (${eLabel}, separated by commas)`}
        validateStatus={levelMessages.length ? 'error' : undefined}
        help={levelMessages.length ? levelMessages.join('; ') : undefined}
        style={{ marginBottom: 10 }}
      >
        <Input
          key={`${energyUnit}:${levelsText}`}
          aria-label="Binding-energy contours"
          defaultValue={levelsText}
          // Unchanged text keeps the stored levels exactly (the shown text is rounded to 4 figures).
          onBlur={(e) => e.target.value !== levelsText && set(['contours', 'levelsKelvin'])(parseLevels(e.target.value, energyUnit))}
          onPressEnter={(e) => (e.target as HTMLInputElement).value !== levelsText && set(['contours', 'levelsKelvin'])(parseLevels((e.target as HTMLInputElement).value, energyUnit))}
        />
      </Form.Item>

      <Section title="Field bands" />
      {draft.fieldBands.map((band, k) => (
        <Space.Compact block key={k} style={{ marginBottom: 4 }}>
          <Form.Item validateStatus={issuesAt(issues, `fieldBands.${k}`).length ? 'error' : undefined} help={issuesAt(issues, `fieldBands.${k}`).join('; ') || undefined} style={{ marginBottom: 4, width: '100%' }}>
            <Space.Compact block>
              <Input aria-label={`Field band ${k + 1} label`} value={band.label} onChange={(e) => set(['fieldBands', k, 'label'])(e.target.value)} style={{ width: '40%' }} />
              <UnitNumberInput aria-label={`Field band ${k + 1} from`} value={band.minTesla} toDisplay={(x) => fieldTeslaToDisplay(x, fieldUnit)} fromDisplay={(x) => fieldDisplayToTesla(x, fieldUnit)} onChange={set(['fieldBands', k, 'minTesla'])} style={{ width: '25%' }} />
              <UnitNumberInput aria-label={`Field band ${k + 1} to`} value={band.maxTesla} toDisplay={(x) => fieldTeslaToDisplay(x, fieldUnit)} fromDisplay={(x) => fieldDisplayToTesla(x, fieldUnit)} onChange={set(['fieldBands', k, 'maxTesla'])} style={{ width: '25%' }} />
              <Button aria-label={`Remove field band ${k + 1}`} icon={<DeleteOutlined />} onClick={() => set(['fieldBands'])(draft.fieldBands.filter((_, j) => j !== k))} />
            </Space.Compact>
          </Form.Item>
        </Space.Compact>
      ))}
      <Button
        size="small"
        icon={<PlusOutlined />}
        disabled={draft.fieldBands.length >= SETUP_LIMITS.maxFieldBands}
        onClick={() =>
          set(['fieldBands'])([
            ...draft.fieldBands,
            { label: `Band ${draft.fieldBands.length + 1}`, minTesla: draft.fieldAxis.min, maxTesla: Math.sqrt(draft.fieldAxis.min * draft.fieldAxis.max) },
          ])
        }
      >
        Add field band ({bLabel})
      </Button>
      {(draft.fieldBands.length > 0 || draft.fieldAxis.min <= 100) && (
        <div style={{ marginTop: 8 }}>
          <MagnetSafetyNote compact />
        </div>
      )}

    </Form>
  );
});

type SpeciesFieldProps = Pick<SetupPanelProps, 'draft' | 'issues' | 'onChange'> & { speciesOptions: NonNullable<SetupPanelProps['speciesOptions']> };

/**
 * The species of the overlay, in a form of its own after the other fields: the catalogue arrives after the page
 * opens (and may change), which then re-renders this one field rather than the whole setup form.
 */
const SpeciesField = memo(function SpeciesField({ draft, issues, onChange, speciesOptions }: SpeciesFieldProps) {
  const options = useMemo(() => speciesOptions.map((o) => ({ value: o.value, label: o.label })), [speciesOptions]);
  return (
    <Form layout="vertical" size="small" requiredMark={false} aria-label="Species of the map">
      <Section title="Species on the map" />
      <Form.Item validateStatus={issuesAt(issues, 'species').length ? 'error' : undefined} help={issuesAt(issues, 'species').join('; ') || undefined} style={{ marginBottom: 10 }}>
        <Select
          mode="multiple"
          aria-label="Species on the map"
          placeholder="Mark atoms at their polarizability…"
          value={draft.species}
          onChange={(value: string[]) => onChange(setIn(draft, ['species'], value))}
          options={options}
          optionFilterProp="label"
          maxTagCount={12}
        />
      </Form.Item>
    </Form>
  );
});
