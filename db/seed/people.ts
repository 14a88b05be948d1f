import type { Role } from '@/db/types';

// Invented people of two invented spaces. The demo password is printed by `npm start`.
export const DEMO_PASSWORD = 'bench-demo-2026';

export type DemoPerson = { name: string; email: string; roles: Partial<Record<'quillmere' | 'fernwick', Role[]>> };

export const DEMO_PEOPLE: DemoPerson[] = [
  { name: 'Perpetua Vantwerp', email: 'perpetua@quillmere.example', roles: { quillmere: ['admin'] } },
  { name: 'Tobiah Quennell', email: 'tobiah@quillmere.example', roles: { quillmere: ['steward'] } },
  { name: 'Marisol Feathergill', email: 'marisol@quillmere.example', roles: { quillmere: ['treasurer'] } },
  { name: 'Juniper Oakhollow', email: 'juniper@quillmere.example', roles: { quillmere: ['member'] } },
  { name: 'Cassius Wrenfield', email: 'cassius@quillmere.example', roles: { quillmere: ['member'] } },
  { name: 'Ines Marrowby', email: 'ines@quillmere.example', roles: { quillmere: ['member'] } },
  { name: 'Dov Lanternby', email: 'dov@quillmere.example', roles: { quillmere: ['member'] } },
  { name: 'Rosalind Emberquist', email: 'rosalind@emberquist.example', roles: { quillmere: ['member'], fernwick: ['member'] } },
  { name: 'Aurelio Finchbourne', email: 'aurelio@fernwick.example', roles: { fernwick: ['admin'] } },
  { name: 'Greta Thimbleby', email: 'greta@fernwick.example', roles: { fernwick: ['steward'] } },
  { name: 'Lorcan Ashdown', email: 'lorcan@fernwick.example', roles: { fernwick: ['treasurer'] } },
  { name: 'Mirela Quoddy', email: 'mirela@fernwick.example', roles: { fernwick: ['member'] } },
  { name: 'Tamsin Hollowell', email: 'tamsin@fernwick.example', roles: { fernwick: ['member'] } },
];
