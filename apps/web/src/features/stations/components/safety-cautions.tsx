// Where a wheel is mounted or dressed the work can hurt someone, so the cautions sit beside the form rather than
// in a manual nobody opens at the counter.

const MOUNT = [
  'Ring-test and inspect a new wheel before mounting it: a cracked or damaged wheel can burst. Do not mount a wheel that rings dull or shows a crack or chip.',
  "Check the wheel's marked maximum speed against the station's RPM. Never run a wheel above its rated speed.",
  'Put the wheel guard back and set the work rest before starting the motor; stand aside from the wheel on the first start-up.',
  'Wear eye protection and run the dust extraction.',
];

const DRESS = [
  'Keep the wheel guard in place and the work rest set close to the wheel while dressing.',
  'Wear eye protection and run the dust extraction: dressing throws grit and fine dust.',
  'Feed the dresser gently and steadily; stop if the wheel vibrates or sounds wrong, and inspect it.',
];

export function SafetyCautions({ work }: { work: 'mount' | 'dress' }) {
  const items = work === 'mount' ? MOUNT : DRESS;
  return (
    <aside aria-label={work === 'mount' ? 'Safety when mounting a wheel' : 'Safety when dressing a wheel'} className="rounded-lg border-l-4 border-amber bg-amber-50 px-4 py-3 text-sm">
      <p className="font-bold">Safety</p>
      <ul className="mt-1 list-disc space-y-1 pl-5">
        {items.map((item) => (
          <li key={item}>{item}</li>
        ))}
      </ul>
      <p className="mt-2 text-xs text-ink-soft">Local codes, the machine maker's manual and licensed practice take precedence over these notes.</p>
    </aside>
  );
}
