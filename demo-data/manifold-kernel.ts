import Module, { type Manifold, type ManifoldToplevel } from 'manifold-3d';
import type { TriangleMesh } from './mesh';

let kernel: Promise<ManifoldToplevel> | undefined;

/** The manifold-3d WebAssembly kernel, loaded and set up once per process. */
export function manifoldKernel(): Promise<ManifoldToplevel> {
  kernel ??= Module().then((wasm) => {
    wasm.setup();
    return wasm;
  });
  return kernel;
}

/** A solid from a closed mesh, with its own original id so its triangles can be traced. */
export function solidFromMesh(wasm: ManifoldToplevel, mesh: TriangleMesh): Manifold {
  const m = new wasm.Mesh({ numProp: 3, vertProperties: mesh.positions, triVerts: mesh.triangles });
  const solid = new wasm.Manifold(m);
  const original = solid.asOriginal();
  solid.delete();
  return original;
}
