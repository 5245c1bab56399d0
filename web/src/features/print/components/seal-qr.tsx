import QRCode from 'qrcode';
import { useEffect, useState } from 'react';

/**
 * The seal's verify address as a QR code (the qrcode package, made here in the page: nothing is
 * fetched). Medium error correction (ISO/IEC 18004 level M) survives a photocopied sheet.
 */
export function SealQr({ url, onReady }: { url: string; onReady: (url: string) => void }) {
  const [svg, setSvg] = useState<string | null>(null);
  useEffect(() => {
    let live = true;
    void QRCode.toString(url, { type: 'svg', errorCorrectionLevel: 'M', margin: 1 }).then((s) => {
      if (!live) return;
      setSvg(s);
      onReady(url);
    });
    return () => {
      live = false;
    };
  }, [url, onReady]);
  return (
    <figure className="mt-2 flex items-center gap-3">
      <div
        role="img"
        aria-label={`QR code of ${url}`}
        className="size-[28mm] shrink-0"
        // The SVG comes from the qrcode package, from our own verify address: no user markup.
        dangerouslySetInnerHTML={svg ? { __html: svg } : undefined}
      />
      <figcaption className="text-[7.5pt] text-black/70">
        Scan to check this seal at {url}
      </figcaption>
    </figure>
  );
}
