// A sale's short reference: what people read on receipts, in the Books and in the CSV, instead of
// the sale's UUID. It is derived from the id (no column, no counter): the first 40 bits of the UUID
// in Crockford's Base32 (no I, L, O or U, so it reads aloud without confusion), as two groups of
// four. Forty random bits make two sales of one space sharing a reference vanishingly unlikely
// (about one in ten thousand after ten thousand sales); the full id stays one tap away.

const ALPHABET = '0123456789ABCDEFGHJKMNPQRSTVWXYZ';

export function saleRef(id: string): string {
  const hex = id.replace(/-/g, '').slice(0, 10);
  if (!/^[0-9a-f]{10}$/i.test(hex)) throw new Error(`not a sale id: ${id}`);
  let bits = BigInt(`0x${hex}`);
  let out = '';
  for (let i = 0; i < 8; i += 1) {
    out = ALPHABET[Number(bits & 31n)] + out;
    bits >>= 5n;
  }
  return `${out.slice(0, 4)}-${out.slice(4)}`;
}
