// Quarterbeat's mark on a 32 × 32 grid: four nodes on a ring, its four quarter-arcs joining them, and inside
// one quarter filled — a network looked at a quarter at a time. The header, the sign-in page and the funder
// report's PDF all draw it from these shapes; src/public/favicon.svg holds the same paths.
export const markGeometry = {
  size: 32,
  /** The four quarter-arcs of the ring (radius 11), each stopping short of the nodes at its ends (26° to 64° of each quarter). */
  arcs: [
    "M25.89 20.82A11 11 0 0 1 20.82 25.89",
    "M11.18 25.89A11 11 0 0 1 6.11 20.82",
    "M6.11 11.18A11 11 0 0 1 11.18 6.11",
    "M20.82 6.11A11 11 0 0 1 25.89 11.18",
  ],
  arcWidth: 2.4,
  /** The filled quarter inside the ring, top right (radius 8). */
  quarter: "M16 16V8a8 8 0 0 1 8 8z",
  nodes: [
    [16, 5],
    [27, 16],
    [16, 27],
    [5, 16],
  ],
  nodeRadius: 3.3,
} as const;
