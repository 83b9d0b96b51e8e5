/** The small part of clipper-lib (Angus Johnson's Clipper 6, JavaScript port) the engine uses. */
declare module 'clipper-lib' {
  interface IntPoint {
    X: number;
    Y: number;
  }
  type Path = IntPoint[];
  type Paths = Path[];
  class ClipperOffset {
    constructor(miterLimit?: number, arcTolerance?: number);
    AddPath(path: Path, joinType: number, endType: number): void;
    Execute(solution: Paths, delta: number): void;
  }
  const ClipperLib: {
    ClipperOffset: typeof ClipperOffset;
    JoinType: { jtSquare: number; jtRound: number; jtMiter: number };
    EndType: { etClosedPolygon: number };
    Clipper: { Area(path: Path): number; Orientation(path: Path): boolean };
  };
  export default ClipperLib;
}
