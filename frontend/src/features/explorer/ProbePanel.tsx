import { memo, useEffect, useMemo, useRef, useState, type CSSProperties, type ReactNode } from 'react';
import { App, Alert, Button, Space, Spin, Table, Tag, Tooltip, Typography, type TableColumnsType } from 'antd';
import { CopyOutlined } from '@ant-design/icons';
import { teslaToAtomic, toHartree, type MapSetup, type Tesla } from '@fieldbound/shared';
import { ALPHA_UNIT_LABEL, ENERGY_UNIT_LABEL, FIELD_UNIT_LABEL, alphaToDisplay, energyToDisplay, fieldTeslaToDisplay } from '../map-render/displayUnits';
import { formatScientific } from '../map-render/formatNumber';
import { palette } from '../../theme/palette';
import { motionKey } from './hooks/useMapComputation';
import type { EnginePool } from '../../workers/enginePool';
import type { MapComputeError } from '../../workers/engineContract';
import { ADIABATIC_LIMIT, FLAG_TEXT, classText, lifetimeText, motionText, probeAsText, probeRows, tightNumber, widthText, type ProbeRow } from './probeText';
import { CHART_MIN_WIDTH, PotentialChart, RingChart } from './ProbeCharts';
import { useElementSize } from './useElementSize';
import type { ProbePoint } from './viewState';

export interface ProbePanelProps {
  point: ProbePoint;
  setup: MapSetup;
  pool: EnginePool | null;
}

type ProbeState = { status: 'loading' } | { status: 'done'; rows: ProbeRow[] } | { status: 'error'; error: MapComputeError };

/**
 * Every state at the probed point: the engine's per-point `levels` and, for the setup's ion motion, its `motionStates`
 * (width, lifetime, class; fractions for thermal ions), with two small charts.
 */
export const ProbePanel = memo(function ProbePanel({ point, setup, pool }: ProbePanelProps) {
  const { message } = App.useApp();
  const [state, setState] = useState<ProbeState>({ status: 'loading' });
  const [attempt, setAttempt] = useState(0);
  const [selected, setSelected] = useState<string | null>(null);
  const fieldAu = teslaToAtomic(point.tesla as Tesla) as number;
  const { alphaUnit, fieldUnit, energyUnit } = setup.display;
  const cutoff = setup.shortRange.cutoffBohr;
  const mMax = setup.orbitals.mMax;
  const floorHartree = toHartree('K', setup.energyFloorKelvin) as number;
  // The probe is solved again only when the point, the physics or the motion settings change (not the display).
  const moving = motionKey(setup);
  // eslint-disable-next-line react-hooks/exhaustive-deps
  const motionSetup = useMemo(() => setup, [moving]);

  useEffect(() => {
    if (!pool) return;
    let live = true;
    setState({ status: 'loading' });
    pool
      .run((api) => api.probeAt({ alpha: point.alpha, fieldAu, cutoffBohr: cutoff, mMax, energyFloorHartree: floorHartree }, motionSetup), { timeoutMs: 60_000 })
      .then(
        (r) => live && setState({ status: 'done', rows: probeRows(r.levels, r.motion) }),
        (error: MapComputeError) => live && setState({ status: 'error', error }),
      );
    return () => {
      live = false;
    };
  }, [pool, point.alpha, fieldAu, cutoff, mMax, floorHartree, motionSetup, attempt]);

  const states = state.status === 'done' ? state.rows : [];
  const chosen = useMemo(() => states.find((s) => `${s.m}:${s.nu}` === selected) ?? states[0] ?? null, [states, selected]);
  const eLabel = ENERGY_UNIT_LABEL[energyUnit];
  const columns = useMemo(() => probeColumns(energyUnit), [energyUnit]);

  // The panel's width decides whether the two charts sit side by side or one above the other.
  const box = useRef<HTMLDivElement>(null);
  const { width } = useElementSize(box);
  const wide = width >= WIDE_PANEL;
  const chartWidth = width <= 0 ? CHART_MIN_WIDTH : wide ? Math.floor((width - CHART_GAP) / 2) : width;

  return (
    <div ref={box}>
      <Space orientation="vertical" size="middle" style={{ width: '100%' }}>
        {/* A list, not a table: the panel's only table is the states' (its headers are the ones read by column). */}
        <dl aria-label="Probed point" style={POINT_LIST}>
          <PointItem label="Polarizability α">
            <Num>
              {formatScientific(alphaToDisplay(point.alpha, alphaUnit), { digits: 5 })} {ALPHA_UNIT_LABEL[alphaUnit]}
            </Num>
          </PointItem>
          <PointItem label="Magnetic field B">
            <Num>
              {formatScientific(fieldTeslaToDisplay(point.tesla, fieldUnit), { digits: 5 })} {FIELD_UNIT_LABEL[fieldUnit]}
            </Num>
            {fieldUnit === 'T' && (
              <>
                {' '}
                <Num>({formatScientific(fieldAu, { digits: 4 })} a.u.)</Num>
              </>
            )}
          </PointItem>
          <PointItem label="Cutoff radius r_c">
            <Num>{formatScientific(cutoff, { digits: 4 })} a₀</Num>
          </PointItem>
        </dl>

        {state.status === 'loading' && (
          <Space>
            <Spin size="small" /> <Typography.Text type="secondary">Solving every orbital at this point…</Typography.Text>
          </Space>
        )}
        {state.status === 'error' && (
          <Alert
            type="error"
            showIcon
            role="alert"
            title="Could not solve this point"
            description={state.error.message}
            action={
              <Button size="small" type="primary" onClick={() => setAttempt((a) => a + 1)}>
                Retry
              </Button>
            }
          />
        )}
        {state.status === 'done' && (
          <>
            <Table<ProbeRow>
              size="small"
              pagination={false}
              rowKey={(s) => `${s.m}:${s.nu}`}
              dataSource={states}
              // Wider than the panel: the table scrolls sideways with m and ν kept in view.
              scroll={{ x: TABLE_WIDTH, y: 320 }}
              onRow={(s) => ({ onClick: () => setSelected(`${s.m}:${s.nu}`), style: { cursor: 'pointer' } })}
              rowClassName={(s) => (chosen && s.m === chosen.m && s.nu === chosen.nu ? 'ant-table-row-selected' : '')}
              columns={columns}
            />
            <Typography.Text type="secondary" style={{ fontSize: 12 }}>
              {states.length} states in orbitals m = 0…{mMax}. Ion motion: {motionText(setup)}. Widths and classes from the engine’s moving-ion width table (accuracy of ln Γ about ±0.2 in the laboratory regime); radiative decay and collisions are not included.
            </Typography.Text>
            {chosen && (
              <div style={{ display: 'flex', flexWrap: 'wrap', gap: CHART_GAP }}>
                <PotentialChart m={chosen.m} alphaAu={point.alpha} fieldAu={fieldAu} cutoffBohr={cutoff} bindingHartree={chosen.bindingHartree} energyUnit={energyUnit} energyUnitLabel={eLabel} width={chartWidth} />
                <RingChart mMax={mMax} selectedM={chosen.m} fieldAu={fieldAu} alphaAu={point.alpha} cutoffBohr={cutoff} width={chartWidth} />
              </div>
            )}
            <Button
              icon={<CopyOutlined />}
              onClick={() => {
                const text = probeAsText(point, setup, states);
                navigator.clipboard?.writeText(text).then(
                  () => message.success('Probe copied as text'),
                  () => message.error('Could not copy: the browser refused access to the clipboard'),
                );
              }}
            >
              Copy as text
            </Button>
          </>
        )}
      </Space>
    </div>
  );
});

/** From this panel width on, the two charts sit side by side. */
const WIDE_PANEL = 2 * CHART_MIN_WIDTH + 24;
const CHART_GAP = 16;

const NUM_STYLE: CSSProperties = { whiteSpace: 'nowrap', fontVariantNumeric: 'tabular-nums' };

/** A number (with its unit, when it has one) that never breaks over lines; digits of equal width line up in columns. */
function Num({ children, style }: { children: ReactNode; style?: CSSProperties }) {
  return <span style={style ? { ...NUM_STYLE, ...style } : NUM_STYLE}>{children}</span>;
}

/** The point's numbers: as many to a row as fit at 170 px or more each (all three in a wide panel). */
const POINT_LIST: CSSProperties = { display: 'grid', gridTemplateColumns: 'repeat(auto-fit, minmax(170px, 1fr))', gap: '6px 16px', margin: 0, padding: '8px 12px', border: `1px solid ${palette.unbound}`, borderRadius: 6 };
const POINT_LABEL: CSSProperties = { fontSize: 12, color: '#5b5d70' };
const POINT_VALUE: CSSProperties = { margin: 0 };

function PointItem({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div>
      <dt style={POINT_LABEL}>{label}</dt>
      <dd style={POINT_VALUE}>{children}</dd>
    </div>
  );
}

const FRACTION_STYLE: CSSProperties = { ...NUM_STYLE, fontSize: 11, color: '#5b5d70' };
const FLAGGED_RATIO: CSSProperties = { color: palette.ink, fontWeight: 700, textDecoration: 'underline dotted' };

/** Column widths in pixels: enough for a number of 4 significant figures with its power of ten on one line. */
const COLUMN_WIDTH = { m: 44, nu: 44, energy: 108, width: 104, lifetime: 100, class: 108, ratio: 72, flags: 176 };
const TABLE_WIDTH = Object.values(COLUMN_WIDTH).reduce((a, b) => a + b, 0);

/** The state table's columns; the units are in the headers, so the cells hold numbers only. */
function probeColumns(energyUnit: ProbePanelProps['setup']['display']['energyUnit']): TableColumnsType<ProbeRow> {
  const eLabel = ENERGY_UNIT_LABEL[energyUnit];
  return [
    { title: 'm', dataIndex: 'm', width: COLUMN_WIDTH.m, fixed: 'left', align: 'right' },
    { title: 'ν', dataIndex: 'nu', width: COLUMN_WIDTH.nu, fixed: 'left', align: 'right' },
    {
      title: `Binding energy (${eLabel})`,
      key: 'e',
      width: COLUMN_WIDTH.energy,
      align: 'right',
      render: (_, s) => <Num>{tightNumber(formatScientific(energyToDisplay(s.bindingHartree, energyUnit), { digits: 4 }))}</Num>,
    },
    { title: `Width Γ (${eLabel})`, key: 'w', width: COLUMN_WIDTH.width, align: 'right', render: (_, s) => <Num>{tightNumber(widthText(s, energyUnit))}</Num> },
    { title: 'Lifetime ħ/Γ (s)', key: 'l', width: COLUMN_WIDTH.lifetime, align: 'right', render: (_, s) => <Num>{tightNumber(lifetimeText(s))}</Num> },
    {
      title: 'Class',
      key: 'c',
      width: COLUMN_WIDTH.class,
      render: (_, s) => (
        <Tooltip title={s.fractions ? classText(s) : undefined}>
          {/* Solid: antd 6 draws a custom colour as a pale fill by default, under which the white text vanished. */}
          <Tag variant={s.class === 'bound' || s.class === 'resonance' ? 'solid' : undefined} color={s.class === 'bound' ? palette.bound : s.class === 'resonance' ? palette.resonance : undefined} style={{ marginInlineEnd: 0, color: s.class === 'bound' || s.class === 'resonance' ? '#fff' : undefined }}>
            {s.class}
          </Tag>
          {s.fractions && <div style={FRACTION_STYLE}>{tightNumber(formatScientific(100 * s.fractions.bound, { digits: 3, plainMin: 0.01 }))} % bound</div>}
        </Tooltip>
      ),
    },
    {
      title: <Tooltip title={`Adiabatic-validity ratio ε/B: the single-orbital reduction is trusted below ${ADIABATIC_LIMIT}.`}>ε/B</Tooltip>,
      key: 'eb',
      width: COLUMN_WIDTH.ratio,
      align: 'right',
      render: (_, s) => <Num style={s.bindingOverB > ADIABATIC_LIMIT ? FLAGGED_RATIO : undefined}>{tightNumber(formatScientific(s.bindingOverB, { digits: 3 }))}</Num>,
    },
    {
      title: 'Flags',
      key: 'f',
      width: COLUMN_WIDTH.flags,
      render: (_, s) =>
        s.flags.length === 0 ? (
          <Typography.Text type="secondary">—</Typography.Text>
        ) : (
          s.flags.map((f) => (
            <Tooltip key={f} title={FLAG_TEXT[f]?.meaning}>
              <Tag style={{ marginInlineEnd: 2, marginBlock: 1 }}>{FLAG_TEXT[f]?.label ?? f}</Tag>
            </Tooltip>
          ))
        ),
    },
  ];
}
