'use client';

import { useState } from 'react';
import { BusyButton } from '@/components/ui/busy-button';

/** The file name the server gave (Content-Disposition), else `fallback`. */
function fileNameOf(disposition: string | null, fallback: string): string {
  const star = /filename\*=UTF-8''([^;]+)/i.exec(disposition ?? '');
  if (star) return decodeURIComponent(star[1]!);
  const plain = /filename="?([^";]+)"?/i.exec(disposition ?? '');
  return plain?.[1] ?? fallback;
}

/**
 * A download that can take a while (an export computes missing forecasts first): a button that is
 * disabled and says so until the file has come, then saves it under the server's file name; a refusal
 * is shown beside it in the server's words.
 */
export function DownloadButton({
  href,
  children,
  className = 'gw-button-quiet',
  fallbackName = 'gatewell-export',
}: {
  href: string;
  children: React.ReactNode;
  className?: string;
  fallbackName?: string;
}) {
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);

  async function download() {
    setBusy(true);
    setError(null);
    try {
      const response = await fetch(href);
      if (!response.ok) {
        const json = (await response.json().catch(() => ({}))) as { message?: string };
        throw new Error(json.message ?? `The server answered ${response.status}.`);
      }
      const blob = await response.blob();
      const url = URL.createObjectURL(blob);
      const link = document.createElement('a');
      link.href = url;
      link.download = fileNameOf(response.headers.get('content-disposition'), fallbackName);
      document.body.append(link);
      link.click();
      link.remove();
      setTimeout(() => URL.revokeObjectURL(url), 10_000);
    } catch (e) {
      setError(e instanceof Error ? e.message : 'The file could not be made.');
    } finally {
      setBusy(false);
    }
  }

  return (
    <>
      <BusyButton className={className} busy={busy} busyLabel="Preparing the file…" onClick={download}>
        {children}
      </BusyButton>
      {error ? (
        <span role="alert" className="text-xs text-signal-fail">
          {error}
        </span>
      ) : null}
    </>
  );
}
