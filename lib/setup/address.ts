// Whether the address labels and e-mails carry can be reached from members' phones: a loopback host
// (127.0.0.0/8, ::1, localhost) only ever reaches the machine that opens it.
export function isLoopbackUrl(url: string): boolean {
  let host: string;
  try {
    host = new URL(url).hostname.toLowerCase();
  } catch {
    return false;
  }
  host = host.replace(/^\[|\]$/g, '');
  return host === 'localhost' || host.endsWith('.localhost') || host === '::1' || /^127(\.\d{1,3}){3}$/.test(host);
}
