// The benchmark clusters: N invented QDOs (Quelon/Virid, demo species) at random in a cube, centres at least
// 6 bohr apart (a dense liquid-like cluster); seeded, so every script and run gets the same geometry.
// `drude` is the species constructor of the build being measured.
export function randomCluster(N, drude) {
  const Quelon = drude({ q: 1.1, m: 0.38, w: 0.72 }, 'Quelon');
  const Virid = drude({ q: 1.45, m: 0.52, w: 0.6 }, 'Virid');
  let seed = 12345;
  const rnd = () => (seed = (seed * 16807) % 2147483647) / 2147483647;
  const L = Math.cbrt(N) * 7.5;
  const pts = [];
  while (pts.length < N) {
    const p = [rnd() * L, rnd() * L, rnd() * L];
    if (pts.every((q) => Math.hypot(p[0] - q[0], p[1] - q[1], p[2] - q[2]) > 6)) pts.push(p);
  }
  return pts.map((p, i) => ({ label: i % 3 ? 'Quelon' : 'Virid', species: i % 3 ? Quelon : Virid, position: p }));
}
