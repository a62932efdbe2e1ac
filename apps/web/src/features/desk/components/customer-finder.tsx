import { useState } from 'react';
import type { CustomerRow } from '@rinkwright/core';
import { Button } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/feedback';
import { TextField } from '../../../components/ui/field';
import { ApiError } from '../../../lib/api-client';
import { newKey } from '../../../lib/outbox';
import { useCreateCustomer } from '../api/create-customer';
import { useCustomerSearch } from '../api/search-customers';

/** Find a skater by name, phone, e-mail or member code, or add a walk-up in two fields. */
export function CustomerFinder({ slug, onPick }: { slug: string; onPick: (c: CustomerRow) => void }) {
  const [q, setQ] = useState('');
  const search = useCustomerSearch(slug, q.trim());
  const create = useCreateCustomer(slug);
  const [name, setName] = useState('');
  const [contact, setContact] = useState('');
  const [problem, setProblem] = useState<{ name?: string; contact?: string; form?: string }>({});

  async function addWalkUp(e: React.FormEvent) {
    e.preventDefault();
    const value = contact.trim();
    if (!name.trim()) return setProblem({ name: 'Enter a name' });
    if (!value) return setProblem({ contact: 'Enter a phone number or an e-mail, to tell them their skates are ready' });
    try {
      const made = await create.mutateAsync({ input: value.includes('@') ? { name, email: value } : { name, phone: value }, key: newKey() });
      setName('');
      setContact('');
      setProblem({});
      onPick(made);
    } catch (error) {
      const fields = error instanceof ApiError ? error.fields : undefined;
      setProblem({ name: fields?.name?.join(' '), contact: (fields?.email ?? fields?.phone)?.join(' '), form: fields ? undefined : String((error as Error).message) });
    }
  }

  return (
    <div className="space-y-4">
      <TextField
        label="Find a skater"
        placeholder="Name, phone, e-mail or member code"
        value={q}
        onChange={(e) => setQ(e.target.value)}
        autoComplete="off"
        autoFocus
      />
      <ul className="max-h-72 divide-y divide-rule overflow-y-auto rounded-lg border border-rule bg-white" aria-label="Matching skaters">
        {(search.data?.customers ?? []).map((c) => (
          <li key={c.id}>
            <button type="button" className="flex min-h-12 w-full items-center justify-between gap-3 px-3 text-left hover:bg-glacier" onClick={() => onPick(c)}>
              <span>
                <span className="font-semibold">{c.name}</span>
                <span className="block text-xs text-ink-soft">{c.phone ?? c.email ?? 'no contact'}</span>
              </span>
              <span className="font-mono text-sm font-bold tracking-wider">{c.memberCode}</span>
            </button>
          </li>
        ))}
        {search.data && search.data.customers.length === 0 ? <li className="px-3 py-3 text-sm text-ink-soft">No skater matches “{q}”.</li> : null}
      </ul>
      <form onSubmit={addWalkUp} noValidate className="space-y-3 rounded-lg border border-dashed border-rule p-3">
        <p className="text-sm font-bold">New walk-up</p>
        <Alert>{problem.form}</Alert>
        <TextField label="Name" value={name} onChange={(e) => setName(e.target.value)} error={problem.name} autoComplete="off" />
        <TextField label="Phone or e-mail" value={contact} onChange={(e) => setContact(e.target.value)} error={problem.contact} autoComplete="off" />
        <Button type="submit" tone="secondary" busy={create.isPending} className="w-full">
          Add walk-up
        </Button>
      </form>
    </div>
  );
}
