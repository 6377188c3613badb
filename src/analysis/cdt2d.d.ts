declare module 'cdt2d' {
  /** Constrained Delaunay triangulation; with exterior: false, faces outside the constraint loops are dropped. */
  function cdt2d(points: ReadonlyArray<readonly [number, number]>, edges?: ReadonlyArray<readonly [number, number]>, options?: { delaunay?: boolean; interior?: boolean; exterior?: boolean; infinity?: boolean }): Array<[number, number, number]>;
  export default cdt2d;
}
