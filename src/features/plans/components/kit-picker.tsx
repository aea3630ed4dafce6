import type { Kit } from '@shared/schemas/kit';
import { SelectField } from '@/components/select-field';
import { sig } from '@/lib/units';
import { pickBody, pickExtensionSet, pickLens, toggleTube, type FieldErrors, type PlannerState } from '../lib/planner-state';

interface Props {
  kit: Kit;
  state: PlannerState;
  onChange: (next: PlannerState) => void;
  errors: FieldErrors;
}

/** Body, lens and tubes from the studio's kit; each choice fills the typed fields below. */
export function KitPicker({ kit, state, onChange, errors }: Props) {
  const set = kit.extensionSets.find((s) => s.id === state.extensionSetId);
  return (
    <fieldset className="grid min-w-0 grid-cols-1 gap-3 sm:grid-cols-2">
      <legend className="mb-2 text-sm font-semibold text-ink">From the kit</legend>
      <SelectField label="Body" value={state.bodyId} error={errors.bodyId} onChange={(e) => onChange(pickBody(state, kit.bodies.find((b) => b.id === e.target.value)))}>
        <option value="">Typed values</option>
        {kit.bodies.map((b) => <option key={b.id} value={b.id}>{b.name}</option>)}
      </SelectField>
      <SelectField label="Lens" value={state.lensId} error={errors.lensId} onChange={(e) => onChange(pickLens(state, kit.lenses.find((l) => l.id === e.target.value)))}>
        <option value="">Typed values</option>
        {kit.lenses.map((l) => <option key={l.id} value={l.id}>{l.name}</option>)}
      </SelectField>
      <SelectField label="Extension set" value={state.extensionSetId} error={errors.extensionSetId} onChange={(e) => onChange(pickExtensionSet(state, kit.extensionSets.find((s) => s.id === e.target.value)))}>
        <option value="">None / typed extension</option>
        {kit.extensionSets.map((s) => <option key={s.id} value={s.id}>{s.name}</option>)}
      </SelectField>
      {set ? (
        <fieldset className="min-w-0">
          <legend className="text-sm font-medium text-ink">Tubes combined</legend>
          <div className="mt-1 flex flex-wrap gap-x-4 gap-y-1">
            {set.tubeLengthsMm.map((t, i) => (
              <label key={i} className="num flex items-center gap-1.5 text-sm">
                <input type="checkbox" className="h-4 w-4 accent-moss" checked={state.tubeIndexes.includes(i)} onChange={() => onChange(toggleTube(state, set, i))} />
                {sig(t)} mm
              </label>
            ))}
          </div>
          {errors.tubeIndexes ? <p role="alert" className="text-xs text-clay">{errors.tubeIndexes}</p> : null}
        </fieldset>
      ) : null}
      {kit.bodies.length + kit.lenses.length === 0 ? (
        <p className="text-xs text-slate sm:col-span-2">The studio’s kit is empty; type the values below, or add gear on the Kit page.</p>
      ) : null}
    </fieldset>
  );
}
