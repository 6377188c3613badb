/**
 * One ISO 4762 M3 × 8 socket head cap screw of 7.9 g/cm³ steel, weighed by hand from its standard
 * dimensions: head dk 5.5 × k 3 (ISO 4762) less a 2.5 mm hex socket half as deep, shank of the pitch
 * diameter d2 = d − 0.649519 P (ISO 724), P 0.5, 8 mm long. Volumes mm³, mass g.
 */
export const ISO_4762_M3X8 = (() => {
  const head = (Math.PI / 4) * 5.5 ** 2 * 3;
  const socket = (Math.sqrt(3) / 2) * 2.5 ** 2 * 1.5;
  const shank = (Math.PI / 4) * (3 - 0.649519 * 0.5) ** 2 * 8;
  return { head, socket, shank, massG: (head - socket + shank) * 7.9e-3 };
})();
