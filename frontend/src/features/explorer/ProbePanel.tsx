import { memo, useEffect, useMemo, useState } from 'react';
import { App, Alert, Button, Descriptions, Space, Spin, Table, Tag, Tooltip, Typography } from 'antd';
import { CopyOutlined } from '@ant-design/icons';
import { teslaToAtomic, toHartree, type MapSetup, type Tesla } from '@fieldbound/shared';
import { ALPHA_UNIT_LABEL, ENERGY_UNIT_LABEL, FIELD_UNIT_LABEL, alphaToDisplay, energyToDisplay, fieldTeslaToDisplay } from '../map-render/displayUnits';
import { formatScientific } from '../map-render/formatNumber';
import { palette } from '../../theme/palette';
import { motionKey } from './hooks/useMapComputation';
import type { EnginePool } from '../../workers/enginePool';
import type { MapComputeError } from '../../workers/engineContract';
import { ADIABATIC_LIMIT, FLAG_TEXT, classText, lifetimeText, motionText, probeAsText, probeRows, widthText, type ProbeRow } from './probeText';
import { PotentialChart, RingChart } from './ProbeCharts';
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

  return (
    <Space orientation="vertical" size="middle" style={{ width: '100%' }}>
      <Descriptions size="small" column={1} bordered>
        <Descriptions.Item label="Polarizability α">
          {formatScientific(alphaToDisplay(point.alpha, alphaUnit), { digits: 5 })} {ALPHA_UNIT_LABEL[alphaUnit]}
        </Descriptions.Item>
        <Descriptions.Item label="Magnetic field B">
          {formatScientific(fieldTeslaToDisplay(point.tesla, fieldUnit), { digits: 5 })} {FIELD_UNIT_LABEL[fieldUnit]}
          {fieldUnit === 'T' ? ` (${formatScientific(fieldAu, { digits: 4 })} a.u.)` : ''}
        </Descriptions.Item>
        <Descriptions.Item label="Cutoff radius r_c">{formatScientific(cutoff, { digits: 4 })} a₀</Descriptions.Item>
      </Descriptions>

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
            scroll={{ y: 260 }}
            onRow={(s) => ({ onClick: () => setSelected(`${s.m}:${s.nu}`), style: { cursor: 'pointer' } })}
            rowClassName={(s) => (chosen && s.m === chosen.m && s.nu === chosen.nu ? 'ant-table-row-selected' : '')}
            columns={[
              { title: 'm', dataIndex: 'm', width: 44 },
              { title: 'ν', dataIndex: 'nu', width: 40 },
              { title: `Binding energy (${eLabel})`, key: 'e', render: (_, s) => formatScientific(energyToDisplay(s.bindingHartree, energyUnit), { digits: 4 }) },
              { title: `Width Γ (${eLabel})`, key: 'w', render: (_, s) => widthText(s, energyUnit) },
              { title: 'Lifetime ħ/Γ (s)', key: 'l', render: (_, s) => lifetimeText(s) },
              {
                title: 'Class',
                key: 'c',
                render: (_, s) => (
                  <Tooltip title={s.fractions ? classText(s) : undefined}>
                    <Tag color={s.class === 'bound' ? palette.bound : s.class === 'resonance' ? palette.resonance : undefined} style={{ marginInlineEnd: 0, color: s.class === 'bound' || s.class === 'resonance' ? '#fff' : undefined }}>
                      {s.class}
                    </Tag>
                    {s.fractions && <div style={{ fontSize: 11, color: '#5b5d70' }}>{formatScientific(100 * s.fractions.bound, { digits: 3, plainMin: 0.01 })} % bound</div>}
                  </Tooltip>
                ),
              },
              {
                title: <Tooltip title={`Adiabatic-validity ratio ε/B: the single-orbital reduction is trusted below ${ADIABATIC_LIMIT}.`}>ε/B</Tooltip>,
                key: 'eb',
                width: 80,
                render: (_, s) => <span style={s.bindingOverB > ADIABATIC_LIMIT ? { color: palette.ink, fontWeight: 700, textDecoration: 'underline dotted' } : undefined}>{formatScientific(s.bindingOverB, { digits: 3 })}</span>,
              },
              {
                title: 'Flags',
                key: 'f',
                render: (_, s) =>
                  s.flags.length === 0 ? (
                    <Typography.Text type="secondary">—</Typography.Text>
                  ) : (
                    s.flags.map((f) => (
                      <Tooltip key={f} title={FLAG_TEXT[f]?.meaning}>
                        <Tag style={{ marginInlineEnd: 2 }}>{FLAG_TEXT[f]?.label ?? f}</Tag>
                      </Tooltip>
                    ))
                  ),
              },
            ]}
          />
          <Typography.Text type="secondary" style={{ fontSize: 12 }}>
            {states.length} states in orbitals m = 0…{mMax}. Ion motion: {motionText(setup)}. Widths and classes from the engine’s moving-ion width table (accuracy of ln Γ about ±0.2 in the laboratory regime); radiative decay and collisions are not included.
          </Typography.Text>
          {chosen && (
            <>
              <PotentialChart m={chosen.m} alphaAu={point.alpha} fieldAu={fieldAu} cutoffBohr={cutoff} bindingHartree={chosen.bindingHartree} energyUnit={energyUnit} energyUnitLabel={eLabel} />
              <RingChart mMax={mMax} selectedM={chosen.m} fieldAu={fieldAu} alphaAu={point.alpha} cutoffBohr={cutoff} />
            </>
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
  );
});
