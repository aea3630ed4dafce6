import type { ReactNode } from 'react';
import type { Kit } from '@shared/schemas/kit';
import { TextField } from '@/components/text-field';
import { SelectField } from '@/components/select-field';
import { fNumber, sig } from '@/lib/units';
import { editField, pickRail, type CocRule, type FieldErrors, type PlannerState, type TextKey } from '../lib/planner-state';
import { KitPicker } from './kit-picker';

interface Props {
  kit: Kit;
  state: PlannerState;
  onChange: (next: PlannerState) => void;
  errors: FieldErrors;
  cocMm: number | null;
}

function Group({ title, children }: { title: string; children: ReactNode }) {
  return (
    <fieldset className="grid min-w-0 grid-cols-2 gap-3 border-t border-rule pt-3">
      <legend className="col-span-2 mb-1 pr-2 text-sm font-semibold text-ink">{title}</legend>
      {children}
    </fieldset>
  );
}

/** Every input of the plan, typed or filled from the kit; errors appear beside their field. */
export function PlannerForm({ kit, state, onChange, errors, cocMm }: Props) {
  const lens = kit.lenses.find((l) => l.id === state.lensId);
  const field = (key: TextKey, label: string, unit?: string, hint?: ReactNode, wide = false) => (
    <TextField
      label={label}
      unit={unit}
      hint={hint}
      value={state[key]}
      inputMode="decimal"
      autoComplete="off"
      onChange={(e) => onChange(editField(state, key, e.target.value))}
      error={errors[key]}
      className={`min-w-0 ${wide ? 'col-span-2' : ''}`}
    />
  );
  return (
    <form aria-label="Stack plan inputs" className="flex min-w-0 flex-col gap-4" onSubmit={(e) => e.preventDefault()} noValidate>
      <KitPicker kit={kit} state={state} onChange={onChange} errors={errors} />
      <Group title="Sensor and lens">
        {field('sensorWidthMm', 'Sensor width', 'mm')}
        {field('sensorHeightMm', 'Sensor height', 'mm')}
        {field('pixelsAcross', 'Pixels across', 'px')}
        {field('focalLengthMm', 'Focal length', 'mm')}
        {field('baseMagnification', 'Lens’s own magnification', '×', lens ? `0 at infinity; up to ${sig(lens.maxMagnification)}× with this lens` : '0 at infinity focus')}
        {field('extensionMm', 'Extension', 'mm', state.tubeIndexes.length ? 'from the tubes ticked above' : undefined)}
        {field('pupilMagnification', 'Pupil magnification', '×', '1 for a symmetric lens')}
      </Group>
      <Group title="Aperture and sharpness">
        {field('fNumber', 'Aperture', 'f-number', lens ? `this lens: ${fNumber(lens.widestFNumber)} – ${fNumber(lens.narrowestFNumber)}` : undefined)}
        <SelectField label="Depth-of-field model" value={state.dofModel} onChange={(e) => onChange({ ...state, dofModel: e.target.value as PlannerState['dofModel'] })} className="min-w-0">
          <option value="geometric">Geometric</option>
          <option value="wave">Wave optics</option>
        </SelectField>
        <SelectField label="Circle of confusion" value={state.cocRule} onChange={(e) => onChange({ ...state, cocRule: e.target.value as CocRule, cocUm: cocMm === null ? state.cocUm : sig(cocMm * 1000, 4) })} className="min-w-0">
          <option value="format">By format</option>
          <option value="pixel">Pixel level</option>
          <option value="custom">Custom</option>
        </SelectField>
        {state.cocRule === 'custom' ? (
          field('cocUm', 'Custom circle of confusion', 'µm')
        ) : (
          <div className="flex min-w-0 flex-col gap-1 text-sm">
            <span className="font-medium text-ink">In use</span>
            <output className="num pt-1.5 text-ink" aria-label="Circle of confusion in use">{cocMm === null ? '—' : `${sig(cocMm * 1000)} µm`}</output>
            <span className="text-xs text-slate">{state.cocRule === 'format' ? 'sensor diagonal ÷ 1500' : '2 × pixel pitch'}</span>
          </div>
        )}
      </Group>
      <Group title="Stack">
        {field('depthMm', 'Depth to cover', 'mm')}
        {field('overlapPct', 'Overlap', '%')}
        <fieldset className="col-span-2 min-w-0">
          <legend className="text-sm font-medium text-ink">Focusing method</legend>
          <div className="mt-1 flex flex-wrap gap-x-5 gap-y-1 text-sm">
            {(['rail', 'camera'] as const).map((m) => (
              <label key={m} className="flex items-center gap-1.5">
                <input type="radio" name="focusing-method" className="h-4 w-4 accent-moss" value={m} checked={state.focusingMethod === m} onChange={() => onChange({ ...state, focusingMethod: m })} />
                {m === 'rail' ? 'Focusing rail' : 'Moving the camera'}
              </label>
            ))}
          </div>
        </fieldset>
        {state.focusingMethod === 'rail' ? (
          <>
            <SelectField label="Rail" value={state.railId} error={errors.railId} className="min-w-0" onChange={(e) => onChange(pickRail(state, kit.rails.find((r) => r.id === e.target.value)))}>
              <option value="">Typed step</option>
              {kit.rails.map((r) => <option key={r.id} value={r.id}>{r.name}</option>)}
            </SelectField>
            {field('railStepUm', 'Rail’s smallest step', 'µm')}
          </>
        ) : null}
      </Group>
      <Group title="Timing">
        {field('secondsPerFrame', 'Seconds per frame', 's', 'exposure + settle + advance')}
        {field('exposureTime', 'Exposure time', 's', 'e.g. 1/125 or 2')}
        {field('stableMin', 'Subject stays still for', 'min', 'leave empty if it does not change', true)}
      </Group>
    </form>
  );
}
