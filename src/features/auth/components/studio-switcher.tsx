import { useId, useState, type FormEvent } from 'react';
import type { Me } from '../api/get-me';
import { useSwitchStudio } from '../api/switch-studio';
import { useCreateStudio } from '../api/create-studio';

const NEW = '__new__';

/** Picks the studio to work in; the last choice is remembered on the server. */
export function StudioSwitcher({ me }: { me: Me }) {
  const id = useId();
  const switchStudio = useSwitchStudio();
  const createStudio = useCreateStudio();
  const [creating, setCreating] = useState(false);
  const [name, setName] = useState('');

  const submit = (e: FormEvent) => {
    e.preventDefault();
    if (name.trim()) createStudio.mutate(name.trim(), { onSuccess: () => setCreating(false) });
  };

  if (creating) {
    return (
      <form onSubmit={submit} className="flex items-center gap-1">
        <label htmlFor={id} className="sr-only">New studio name</label>
        <input id={id} autoFocus value={name} onChange={(e) => setName(e.target.value)} placeholder="Studio name" className="rounded border border-rule px-2 py-1" />
        <button type="submit" className="text-moss">Create</button>
        <button type="button" className="text-slate" onClick={() => setCreating(false)}>Cancel</button>
      </form>
    );
  }
  return (
    <>
      <label htmlFor={id} className="sr-only">Studio</label>
      <select
        id={id}
        value={me.activeStudioId ?? ''}
        onChange={(e) => (e.target.value === NEW ? setCreating(true) : switchStudio.mutate(e.target.value))}
        className="max-w-[16rem] rounded border border-rule bg-card px-2 py-1"
      >
        {me.studios.length === 0 ? <option value="">No studio</option> : null}
        {me.studios.map((s) => (
          <option key={s.id} value={s.id}>{s.name}</option>
        ))}
        <option value={NEW}>+ New studio…</option>
      </select>
    </>
  );
}
