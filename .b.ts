import { fitNetworkMixedModel } from './shared/analysis/index';
function generator(seed: number) { let s = seed >>> 0; return () => { s = (s + 0x6d2b79f5) >>> 0; let t = s; t = Math.imul(t ^ (t >>> 15), t | 1); t ^= t + Math.imul(t ^ (t >>> 7), t | 61); return ((t ^ (t >>> 14)) >>> 0) / 4294967296; }; }
const random = generator(7); const normal = () => Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());
const rows = [];
for (let s = 0; s < 200; s++) { const se = 10 * normal(); for (let b = 0; b < 6; b++) { const be = 2 * normal(); for (const r of [0.25, 0.5, 1, 2]) rows.push({ site: `S${s}`, block: `B${b}`, rate: r, value: 50 + se + be + 12 * r - 4 * r * r + 3 * normal() }); } }
const times = []; for (let i = 0; i < 20; i++) { const t0 = performance.now(); const fit = fitNetworkMixedModel(rows); fit.kenwardRoger([[1, 0, -1, 0], [0, 1, -1, 0], [0, 0, -1, 1]]); times.push(performance.now() - t0); }
console.log(times.map((t) => t.toFixed(0)).join(' '));
