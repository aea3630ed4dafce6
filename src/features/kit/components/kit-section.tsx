import { useState } from 'react';
import type { KitKind } from '@shared/kit-presets';
import type { KitItems } from '@shared/schemas/kit';
import { Button } from '@/components/button';
import { EmptyState, ErrorNote } from '@/components/query-state';
import { useCreateKitItem } from '../api/create-kit-item';
import { useUpdateKitItem } from '../api/update-kit-item';
import { useDeleteKitItem } from '../api/delete-kit-item';
import { KitItemForm } from './kit-item-form';
import type { KindConfig } from './kit-kinds';

interface Props<K extends KitKind> {
  studioId: string;
  config: KindConfig<K>;
  items: KitItems[K][];
  canEdit: boolean;
}

/** One kind of kit: a table for everyone, add / edit / delete for owners and photographers. */
export function KitSection<K extends KitKind>({ studioId, config, items, canEdit }: Props<K>) {
  const [editing, setEditing] = useState<string | 'new' | null>(null);
  const create = useCreateKitItem(studioId, config.kind);
  const update = useUpdateKitItem(studioId, config.kind);
  const remove = useDeleteKitItem(studioId, config.kind);
  const headingId = `kit-${config.kind}-h`;
  const generic = config as unknown as KindConfig<KitKind>;
  const close = () => {
    setEditing(null);
    create.reset();
    update.reset();
  };

  return (
    <section aria-labelledby={headingId} className="mb-10">
      <div className="mb-3 flex flex-wrap items-center justify-between gap-2">
        <h2 id={headingId} className="text-lg font-semibold">{config.title}</h2>
        {canEdit && editing !== 'new' ? <Button variant="secondary" onClick={() => setEditing('new')}>Add {config.one}</Button> : null}
      </div>
      {editing === 'new' ? (
        <div className="mb-4">
          <KitItemForm
            config={generic}
            initial={config.empty}
            submitLabel={`Add ${config.one}`}
            pending={create.isPending}
            error={create.error}
            onSubmit={(input) => create.mutate(input as never, { onSuccess: close })}
            onCancel={close}
          />
        </div>
      ) : null}
      {items.length === 0 ? (
        <EmptyState title={`No ${config.title.toLowerCase()} yet`}>
          {canEdit ? `Add one with “Add ${config.one}” to pick it in the planner.` : 'An owner or photographer adds kit here.'}
        </EmptyState>
      ) : (
        <div className="overflow-x-auto">
          <table className="w-full border-collapse text-sm">
            <caption className="sr-only">{config.title} in the studio’s kit</caption>
            <thead>
              <tr className="border-b border-rule text-left text-slate">
                {config.columns.map((c) => (
                  <th key={c.header} scope="col" className={`py-2 pr-4 font-medium ${c.numeric ? 'text-right' : ''}`}>{c.header}</th>
                ))}
                {canEdit ? <th scope="col" className="py-2 font-medium"><span className="sr-only">Actions</span></th> : null}
              </tr>
            </thead>
            <tbody>
              {items.map((item) => (
                <tr key={item.id} className="border-b border-rule/60">
                  {config.columns.map((c) => (
                    <td key={c.header} className={`py-2 pr-4 ${c.numeric ? 'num text-right whitespace-nowrap' : ''}`}>{c.cell(item)}</td>
                  ))}
                  {canEdit ? (
                    <td className="py-2 text-right whitespace-nowrap">
                      <Button variant="quiet" aria-label={`Edit ${item.name}`} onClick={() => setEditing(item.id)}>Edit</Button>
                      <button
                        type="button"
                        className="px-3 py-1.5 text-sm font-medium text-clay underline-offset-2 hover:underline"
                        aria-label={`Delete ${item.name}`}
                        onClick={() => { if (window.confirm(`Delete “${item.name}” from the kit? Saved plans keep their figures.`)) remove.mutate(item.id); }}
                      >
                        Delete
                      </button>
                    </td>
                  ) : null}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      {editing && editing !== 'new' ? (
        <div className="mt-4">
          <KitItemForm
            key={editing}
            config={generic}
            initial={config.toForm(items.find((i) => i.id === editing) as KitItems[K])}
            submitLabel="Save changes"
            pending={update.isPending}
            error={update.error}
            onSubmit={(input) => update.mutate({ id: editing, change: input as never }, { onSuccess: close })}
            onCancel={close}
          />
        </div>
      ) : null}
      <div className="mt-2"><ErrorNote error={remove.error} /></div>
    </section>
  );
}
