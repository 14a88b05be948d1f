'use client';
import { useRouter } from 'next/navigation';
import { useCallback, useEffect, useRef, useState } from 'react';
import { Camera, CameraOff } from 'lucide-react';
import { formatCode, looseNormalize, suggestCodes } from '@/labels/code';
import { codeFromScan } from '@/labels/url';

type Found = { code: string; kind: string; name: string; href: string };
type Say = { text: string; tone: 'info' | 'error' };
type Controls = { stop: () => void };

const KIND_WORDS: Record<string, string> = {
  unit: 'unit',
  part: 'part',
  location: 'bin',
  kit_box: 'kit box',
};

/** The code a person meant to type, for "did you mean": the last path segment of a URL, or the text itself. */
function typedCode(text: string): string {
  const m = /\/s\/([^/?#]+)\/?$/.exec(text.trim());
  return looseNormalize(m ? m[1] : text);
}

/**
 * One field for a USB scanner (it types the code and Enter), a typed code, or the camera. The check
 * symbol is verified here first; a typo gets the codes one keystroke away that exist in this space.
 */
export function ScanBox({ initial = '' }: { initial?: string }) {
  const router = useRouter();
  const inputRef = useRef<HTMLInputElement>(null);
  const videoRef = useRef<HTMLVideoElement>(null);
  const controlsRef = useRef<Controls | null>(null);
  const [text, setText] = useState(initial);
  const [say, setSay] = useState<Say | null>(null);
  const [suggestions, setSuggestions] = useState<Found[]>([]);
  const [busy, setBusy] = useState(false);
  const [camera, setCamera] = useState<'off' | 'starting' | 'on'>('off');

  const stopCamera = useCallback(() => {
    controlsRef.current?.stop();
    controlsRef.current = null;
    setCamera('off');
  }, []);

  const lookUp = useCallback(
    async (raw: string) => {
      setSuggestions([]);
      const checked = codeFromScan(raw);
      if (!checked.ok) {
        const candidates = checked.reason === 'check' ? suggestCodes(typedCode(raw)) : [];
        if (!candidates.length) return setSay({ text: checked.message, tone: 'error' });
        setBusy(true);
        const res = await fetch('/api/scan', {
          method: 'POST',
          headers: { 'content-type': 'application/json' },
          body: JSON.stringify({ codes: candidates }),
        }).catch(() => null);
        setBusy(false);
        const found: Found[] = res?.ok ? ((await res.json()) as { found: Found[] }).found : [];
        setSuggestions(found);
        return setSay({
          text: found.length
            ? 'That code does not add up. Did you mean:'
            : 'That code does not add up, and nothing one keystroke away is labelled here. Check each character.',
          tone: 'error',
        });
      }
      setBusy(true);
      setSay({ text: `Looking up ${formatCode(checked.code)}…`, tone: 'info' });
      const res = await fetch(`/api/scan/${encodeURIComponent(checked.code)}`).catch(() => null);
      setBusy(false);
      if (res?.ok) {
        const found = (await res.json()) as Found;
        setSay({ text: `Opening ${found.name}…`, tone: 'info' });
        router.push(found.href);
        return;
      }
      setSay({
        text:
          res?.status === 404
            ? `No label ${formatCode(checked.code)} in this space.`
            : 'The lookup failed; try again.',
        tone: 'error',
      });
      inputRef.current?.select();
    },
    [router],
  );

  // A code handed over in the address (a mistyped /s/<code>) is checked straight away.
  useEffect(() => {
    if (!initial) return;
    const t = setTimeout(() => void lookUp(initial), 0);
    return () => clearTimeout(t);
  }, [initial, lookUp]);

  useEffect(() => stopCamera, [stopCamera]);

  async function startCamera() {
    setSay(null);
    setCamera('starting');
    try {
      // The decoder is only downloaded now, so the page itself stays light.
      const { BrowserQRCodeReader } = await import('@zxing/browser');
      const reader = new BrowserQRCodeReader();
      controlsRef.current = await reader.decodeFromConstraints(
        { video: { facingMode: { ideal: 'environment' } }, audio: false },
        videoRef.current!,
        (result, _err, controls) => {
          if (!result) return;
          controls.stop();
          controlsRef.current = null;
          setCamera('off');
          setText(result.getText());
          void lookUp(result.getText());
        },
      );
      setCamera('on');
    } catch (err) {
      stopCamera();
      const name = (err as { name?: string }).name;
      setSay({
        text:
          name === 'NotAllowedError'
            ? 'The camera was not allowed. Allow it in the browser, or type the code.'
            : 'No camera could be opened here; type the code instead.',
        tone: 'error',
      });
    }
  }

  return (
    <div className="space-y-4">
      <form
        onSubmit={(e) => {
          e.preventDefault();
          void lookUp(text);
        }}
        className="space-y-3"
      >
        <label htmlFor="scan-code" className="block text-lg font-bold">
          Label code
        </label>
        <input
          id="scan-code"
          ref={inputRef}
          value={text}
          onChange={(e) => setText(e.target.value)}
          className="field min-h-14 font-mono text-2xl tracking-wider uppercase"
          autoFocus
          autoComplete="off"
          autoCapitalize="characters"
          autoCorrect="off"
          spellCheck={false}
          enterKeyHint="go"
          placeholder="K7F2-QX9"
          aria-describedby="scan-help"
        />
        <p id="scan-help" className="muted text-sm">
          Type the code under the QR, or scan it with a USB scanner. Hyphens and letter case do not matter.
        </p>
        <button type="submit" className="btn-primary min-h-14 w-full text-lg" disabled={busy}>
          Open
        </button>
      </form>

      <div role="status" aria-live="polite">
        {say ? (
          <p className={say.tone === 'error' ? 'font-semibold text-red-800 dark:text-red-300' : 'muted'}>
            {say.text}
          </p>
        ) : null}
        {suggestions.length ? (
          <ul className="mt-2 space-y-2">
            {suggestions.map((s) => (
              <li key={s.code}>
                <button
                  type="button"
                  className="btn-quiet min-h-14 w-full justify-start text-left"
                  onClick={() => router.push(s.href)}
                >
                  <span className="font-mono">{formatCode(s.code)}</span> · {s.name}{' '}
                  <span className="muted">({KIND_WORDS[s.kind] ?? s.kind})</span>
                </button>
              </li>
            ))}
          </ul>
        ) : null}
      </div>

      <div className="space-y-2">
        {camera === 'off' ? (
          <button type="button" className="btn-quiet min-h-14 w-full text-lg" onClick={startCamera}>
            <Camera aria-hidden className="size-6" /> Use camera
          </button>
        ) : (
          <button type="button" className="btn-quiet min-h-14 w-full text-lg" onClick={stopCamera}>
            <CameraOff aria-hidden className="size-6" /> Stop camera
          </button>
        )}
        <video
          ref={videoRef}
          className={camera === 'off' ? 'hidden' : 'aspect-square w-full rounded-xl bg-black object-cover'}
          muted
          playsInline
          aria-label="Camera view: hold a label's QR in the square"
        />
      </div>
    </div>
  );
}
