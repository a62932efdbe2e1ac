import { COMMON_HOLLOWS, type UnitPreference } from '@rinkwright/core';
import { useId } from 'react';
import { lengthInput, parseLength } from '../../../lib/units';

/** A radius of hollow: one of the common ones from a list, or typed in the rink's unit. */
export function HollowField({ label, valueNm, onChange, unit, error }: { label: string; valueNm: number | null; onChange: (nm: number | null) => void; unit: UnitPreference; error?: string | undefined }) {
  const id = useId();
  const common = COMMON_HOLLOWS.find((h) => h.nm === valueNm);
  return (
    <div>
      <label htmlFor={id} className="block text-sm font-semibold">
        {label}
      </label>
      <div className="mt-1 flex gap-2">
        <select
          id={id}
          className="min-h-11 rounded-lg border border-rule bg-white px-2"
          value={common ? String(common.nm) : valueNm === null ? '' : 'other'}
          onChange={(e) => onChange(e.target.value === '' || e.target.value === 'other' ? null : Number(e.target.value))}
        >
          <option value="">—</option>
          {COMMON_HOLLOWS.map((h) => (
            <option key={h.nm} value={h.nm}>
              {h.label}
            </option>
          ))}
          <option value="other">other…</option>
        </select>
        {!common && valueNm !== null ? (
          <input
            aria-label={`${label} (${unit})`}
            className="min-h-11 w-28 rounded-lg border border-rule bg-white px-2 tabular-nums"
            defaultValue={lengthInput(valueNm, unit, 'hollow')}
            onBlur={(e) => onChange(parseLength(e.target.value, unit))}
          />
        ) : null}
      </div>
      {error ? (
        <p className="mt-1 text-sm font-medium text-brick" role="alert">
          {error}
        </p>
      ) : null}
    </div>
  );
}
