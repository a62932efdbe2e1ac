import { Fragment, type ReactNode } from 'react';

/** Parts of one line joined by middle dots; a narrow screen breaks the line between parts, never inside one. */
export function Dotted({ parts }: { parts: ReactNode[] }) {
  return (
    <>
      {parts.map((part, i) => (
        <Fragment key={i}>
          {i > 0 ? ' · ' : null}
          <span className="whitespace-nowrap">{part}</span>
        </Fragment>
      ))}
    </>
  );
}
