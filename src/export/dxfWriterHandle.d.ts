// The handle counter inside the pinned `dxf-writer` (1.18.4): one static seed shared by every drawing.
declare module 'dxf-writer/src/Handle.js' {
  const Handle: { seed: number };
  export default Handle;
}
