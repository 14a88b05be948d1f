// Label PDF speed and memory: 1,000 labels on each layout.
//   npx tsx bench/labels.ts [--count 1000] [--out bench/out]
// Target (README.md, Performance: "label PDF, 1,000 labels"): < 3 s and < 300 MB peak per run.
// Beside each absolute figure: a ratio to a floor measured in the same run — building the 1,000 QR
// matrices alone (qrcode's encoder, no PDF), which no renderer can avoid — so a noisy shared machine
// still gives a comparable number.
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import QRCode from 'qrcode';
import { newCode } from '@/labels/code';
import { LAYOUTS } from '@/labels/layouts';
import { renderLabelsPdf } from '@/labels/pdf';
import type { LabelItem } from '@/labels/schema';
import { labelUrl } from '@/labels/url';

const args = process.argv.slice(2);
const arg = (name: string) => {
  const i = args.indexOf(name);
  return i >= 0 ? args[i + 1] : undefined;
};
const COUNT = Number(arg('--count') ?? 1000);
const OUT = arg('--out');
const MB = 1024 * 1024;

// Demo-style items: invented, generic descriptions.
const NAMES = [
  ['Constant-current buck driver, 350 mA, 6–36 V in', '350 mA · 6–36 V in'],
  ['3 W white LED on 20 mm star', 'Vf 2.9–3.6 V @ 700 mA · 3 W'],
  ['24 V 2 A wall supply', '24 V ± 5 % · 2 A'],
  ['Finned heat sink for star boards, 40 mm', '≈ 6 K/W'],
] as const;
const items: LabelItem[] = Array.from({ length: COUNT }, (_, i) => {
  const code = newCode();
  const [name, spec] = NAMES[i % NAMES.length];
  return { code, url: labelUrl('https://bench.quillmere.example', code), name, spec };
});

const gc = (globalThis as { gc?: () => void }).gc;
let peakRss = 0;
let peakHeap = 0;
function sample() {
  const m = process.memoryUsage();
  peakRss = Math.max(peakRss, m.rss);
  peakHeap = Math.max(peakHeap, m.heapUsed);
}
function resetPeaks() {
  gc?.();
  peakRss = 0;
  peakHeap = 0;
  sample();
}

function floorMs(): number {
  const start = performance.now();
  for (const item of items) QRCode.create(item.url, { errorCorrectionLevel: 'M' });
  return performance.now() - start;
}

async function main() {
  // Warm up module code and the JIT on a small run so the first layout is not charged for it.
  await renderLabelsPdf(items.slice(0, 50), LAYOUTS[0].id);
  const floor = floorMs();
  console.log(
    `label PDF bench · ${COUNT} labels per layout · node ${process.version}${gc ? '' : ' · (run with --expose-gc for cleaner peaks)'}`,
  );
  console.log(`floor: ${COUNT} QR matrices alone ${floor.toFixed(0)} ms`);
  console.log('layout        pages   bytes      wall ms  × floor  peak rss MB  peak heap MB  target');
  const timer = setInterval(sample, 5);
  let allMet = true;
  for (const layout of LAYOUTS) {
    resetPeaks();
    const start = performance.now();
    const pdf = await renderLabelsPdf(items, layout.id, { onProgress: sample });
    const ms = performance.now() - start;
    sample();
    const pages = Math.ceil(COUNT / (layout.columns * layout.rows));
    const met = ms < 3000 && peakRss < 300 * MB;
    allMet &&= met;
    console.log(
      [
        layout.id.padEnd(13),
        String(pages).padStart(5),
        String(pdf.length).padStart(9),
        ms.toFixed(0).padStart(10),
        (ms / floor).toFixed(1).padStart(8),
        (peakRss / MB).toFixed(0).padStart(12),
        (peakHeap / MB).toFixed(0).padStart(13),
        met ? '  met (< 3 s, < 300 MB)' : '  MISSED (< 3 s, < 300 MB)',
      ].join(' '),
    );
    if (OUT) {
      mkdirSync(OUT, { recursive: true });
      writeFileSync(join(OUT, `labels-${layout.id}.pdf`), pdf);
    }
  }
  clearInterval(timer);
  process.exitCode = allMet ? 0 : 1;
}

void main();
