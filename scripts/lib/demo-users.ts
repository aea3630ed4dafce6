import type { Role } from '../../shared/roles';

// Demo sign-ins, printed by npm start. The example.* domain is reserved and never delivers mail.
export const DEMO_STUDIO_NAME = 'Fern & Brass Macro Studio';

export const DEMO_USERS: { role: Role; name: string; email: string; password: string }[] = [
  { role: 'owner', name: 'Studio Owner', email: 'owner@fern-brass.example', password: 'demo-owner-pass' },
  { role: 'photographer', name: 'Bench Photographer', email: 'photographer@fern-brass.example', password: 'demo-photographer-pass' },
  { role: 'retoucher', name: 'Stack Retoucher', email: 'retoucher@fern-brass.example', password: 'demo-retoucher-pass' },
  { role: 'guest', name: 'Workshop Guest', email: 'guest@fern-brass.example', password: 'demo-guest-pass' },
];
