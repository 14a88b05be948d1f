import { describe, expect, it } from 'vitest';
import { isLoopbackUrl } from '@/lib/setup/address';

// Loopback per RFC 1122 §3.2.1.3 (127.0.0.0/8) and RFC 4291 §2.5.3 (::1); "localhost" per RFC 6761 §6.3.
describe('isLoopbackUrl', () => {
  it.each(['http://127.0.0.1:3000', 'http://127.8.9.10/', 'http://localhost:3000', 'https://bench.localhost', 'http://[::1]:3000'])('%s is loopback', (u) => {
    expect(isLoopbackUrl(u)).toBe(true);
  });
  it.each(['https://bench.lan', 'http://192.168.1.20:3000', 'https://10.0.0.5', 'http://[fe80::1]/', 'not a url', 'http://127.example.org'])('%s is not', (u) => {
    expect(isLoopbackUrl(u)).toBe(false);
  });
});
