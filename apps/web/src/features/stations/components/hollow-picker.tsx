import type { FieldErrors, UseFormRegister } from 'react-hook-form';
import { COMMON_HOLLOWS, formatLength, type UnitPreference } from '@rinkwright/core';
import { SelectField, TextField } from '../../../components/ui/field';
import { parseLength } from '../../../lib/units';

export const OTHER = 'other';

interface HollowValues {
  hollowPick: string;
  hollowNm: string;
}

export function hollowOptions(unit: UnitPreference) {
  return [
    ...COMMON_HOLLOWS.map((h) => ({ value: String(h.nm), label: unit === 'in' ? h.label : `${formatLength(h.nm, 'mm', 'hollow').text} (${h.label})` })),
    { value: OTHER, label: 'Another hollow (type it)' },
  ];
}

/** The form's starting pick: a common hollow when the wheel is dressed to one, else typed. */
export function hollowDefaults(nm: number | null | undefined, unit: UnitPreference): HollowValues {
  if (nm == null) return { hollowPick: String(COMMON_HOLLOWS[2]!.nm), hollowNm: '' };
  const common = COMMON_HOLLOWS.some((h) => h.nm === nm);
  return common ? { hollowPick: String(nm), hollowNm: '' } : { hollowPick: OTHER, hollowNm: formatLength(nm, unit, 'hollow').value };
}

export const pickedHollow = (v: HollowValues, unit: UnitPreference): number | null => (v.hollowPick === OTHER ? parseLength(v.hollowNm, unit) : Number(v.hollowPick));

export function HollowPicker<T extends HollowValues>({
  register,
  errors,
  pick,
  unit,
  label,
}: {
  register: UseFormRegister<T>;
  errors: FieldErrors<T>;
  pick: string;
  unit: UnitPreference;
  label: string;
}) {
  const reg = register as unknown as UseFormRegister<HollowValues>;
  const error = (errors as FieldErrors<HollowValues>).hollowNm?.message;
  return (
    <>
      <SelectField label={label} options={hollowOptions(unit)} error={pick === OTHER ? undefined : error} {...reg('hollowPick')} />
      {pick === OTHER ? (
        <TextField
          label={`Radius of hollow (${unit === 'in' ? 'inches, e.g. 9/16 or 0.5625' : 'mm'})`}
          inputMode="decimal"
          autoComplete="off"
          error={error}
          {...reg('hollowNm')}
        />
      ) : null}
    </>
  );
}
