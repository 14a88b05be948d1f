'use client';
import { useEffect, useRef, useState } from 'react';

type Controls = { stop(): void };

// The phone camera as a label reader. The decoder is loaded only when the camera opens, so the
// counter stays light for people who type or use a USB scanner.
export function CameraScan({ onCode }: { onCode: (text: string) => void }) {
  const video = useRef<HTMLVideoElement>(null);
  const controls = useRef<Controls | null>(null);
  const [open, setOpen] = useState(false);
  const [problem, setProblem] = useState<string | null>(null);

  useEffect(() => {
    if (!open || !video.current) return;
    let cancelled = false;
    (async () => {
      try {
        const { BrowserQRCodeReader } = await import('@zxing/browser');
        const reader = new BrowserQRCodeReader();
        const c = await reader.decodeFromVideoDevice(undefined, video.current!, (result) => {
          if (!result) return;
          onCode(result.getText());
          controls.current?.stop();
          setOpen(false);
        });
        if (cancelled) c.stop();
        else controls.current = c;
      } catch {
        setProblem('The camera could not be opened here; type the code instead.');
        setOpen(false);
      }
    })();
    return () => {
      cancelled = true;
      controls.current?.stop();
      controls.current = null;
    };
  }, [open, onCode]);

  return (
    <div>
      <button
        type="button"
        className="btn-quiet w-full"
        onClick={() => (setProblem(null), setOpen((o) => !o))}
        aria-expanded={open}
      >
        {open ? 'Close the camera' : 'Scan with the camera'}
      </button>
      {open ? (
        <video
          ref={video}
          className="mt-2 aspect-square w-full rounded-lg bg-black object-cover"
          muted
          playsInline
          aria-label="Camera view"
        />
      ) : null}
      {problem ? (
        <p className="mt-1 text-sm" role="status">
          {problem}
        </p>
      ) : null}
    </div>
  );
}
