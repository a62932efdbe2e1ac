import QRCode from 'qrcode';
import { useEffect, useState } from 'react';

/** The skater's member code as a QR code: a scanner at the counter types it into the skater search. */
export function MemberQr({ code, size = 128 }: { code: string; size?: number }) {
  const [svg, setSvg] = useState('');
  useEffect(() => {
    let live = true;
    void QRCode.toString(code, { type: 'svg', margin: 1, color: { dark: '#0E2233', light: '#FFFFFF' } }).then((text) => live && setSvg(text));
    return () => {
      live = false;
    };
  }, [code]);
  return (
    <figure className="inline-flex flex-col items-center gap-1">
      <div role="img" aria-label={`QR code of member code ${code}`} style={{ width: size, height: size }} dangerouslySetInnerHTML={{ __html: svg }} />
      <figcaption className="font-mono text-sm font-bold tracking-widest">{code}</figcaption>
    </figure>
  );
}
