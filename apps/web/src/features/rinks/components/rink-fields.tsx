import type { FieldErrors, UseFormRegister } from 'react-hook-form';
import { listTimeZones } from '@rinkwright/core';
import { SelectField } from '../../../components/ui/field';

const zones = listTimeZones().map((z) => ({ value: z, label: z.replaceAll('_', ' ') }));
const currencies = Intl.supportedValuesOf('currency').map((c) => ({ value: c, label: currencyLabel(c) }));

function currencyLabel(code: string): string {
  const name = new Intl.DisplayNames(undefined, { type: 'currency' }).of(code);
  return name && name !== code ? `${code} — ${name}` : code;
}

export const UNIT_OPTIONS = [
  { value: 'in', label: 'Inches (readings in thousandths of an inch)' },
  { value: 'mm', label: 'Millimetres (readings in hundredths of a millimetre)' },
];

/** The browser's zone if the list has it (it may be an alias such as Etc/UTC), else UTC. */
export function guessTimeZone(): string {
  const zone = Intl.DateTimeFormat().resolvedOptions().timeZone;
  return listTimeZones().includes(zone) ? zone : 'UTC';
}

interface RinkFieldValues {
  name: string;
  timeZone: string;
  currency: string;
  unitPreference: 'in' | 'mm';
}

/** The fields a rink's details share between creating a rink and its settings page. */
export function RinkDetailFields<T extends RinkFieldValues>({ register, errors }: { register: UseFormRegister<T>; errors: FieldErrors<T> }) {
  const reg = register as unknown as UseFormRegister<RinkFieldValues>;
  const err = errors as FieldErrors<RinkFieldValues>;
  return (
    <>
      <SelectField label="Time zone" options={zones} error={err.timeZone?.message} hint="Times are shown in this zone." {...reg('timeZone')} />
      <SelectField label="Currency" options={currencies} error={err.currency?.message} {...reg('currency')} />
      <SelectField label="Units" options={UNIT_OPTIONS} error={err.unitPreference?.message} {...reg('unitPreference')} />
    </>
  );
}

