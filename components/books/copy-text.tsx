'use client';
import { Check, Copy } from 'lucide-react';
import { useState } from 'react';

/** An identifier shown in full (it wraps on a phone) with a button that copies it. */
export function CopyText({ label, value }: { label: string; value: string }) {
  const [copied, setCopied] = useState(false);
  return (
    <span className="flex items-start gap-1">
      <span className="font-mono text-xs break-all" data-copy-value>
        {value}
      </span>
      <button
        type="button"
        className="shrink-0 rounded p-1 hover:bg-stone-100 dark:hover:bg-stone-800"
        aria-label={copied ? `${label} copied` : `Copy ${label}`}
        onClick={() => {
          void navigator.clipboard?.writeText(value).then(() => setCopied(true));
        }}
      >
        {copied ? <Check aria-hidden className="size-3.5" /> : <Copy aria-hidden className="size-3.5" />}
      </button>
    </span>
  );
}
