import { useEffect, useRef, useState } from 'react';
import {
  AmbientLight,
  Box3,
  Color,
  DirectionalLight,
  Group,
  HemisphereLight,
  Matrix4,
  Mesh,
  MeshLambertMaterial,
  PerspectiveCamera,
  Raycaster,
  Scene,
  Sphere,
  Vector2,
  Vector3,
  WebGLRenderer,
} from 'three';
import { OrbitControls } from 'three/examples/jsm/controls/OrbitControls.js';
import { buildGeometry, matrixFromRowMajor } from './build-geometry';
import type { MeshView } from './mesh-payload';

/** A surface region of one part of the view. */
export interface RegionSelection {
  part: string;
  region: number;
}

export interface ViewerPart {
  key: string;
  label: string;
  mesh: MeshView;
  /** 4x4 row-major, mm: where this part sits in the view's frame (identity when absent). */
  transform?: readonly number[] | null;
  base: readonly number[];
  fractures?: boolean;
  /** Every region in the colour of its surface class. */
  byClass?: boolean;
  gaps?: Float32Array | null;
  /** Moved by `pullApart` mm along the line from the first part's centre to this one's. */
  pulls?: boolean;
}

/**
 * The 3D view of one or more scans, drawn by three.js (software WebGL is enough). Drag or
 * use the arrow keys to turn, + and - to zoom, 0 to reset; click a surface region to select it.
 * Draws only when something changes.
 */
export function ScanViewer(props: {
  parts: ViewerPart[];
  label: string;
  pullApart?: number;
  selectedRegion?: RegionSelection | null;
  onSelectRegion?: (sel: RegionSelection | null) => void;
  background: string;
  height?: number;
}) {
  const canvas = useRef<HTMLCanvasElement>(null);
  const state = useRef<{
    renderer: WebGLRenderer;
    scene: Scene;
    camera: PerspectiveCamera;
    controls: OrbitControls;
    group: Group;
    meshes: Map<string, { mesh: Mesh; part: ViewerPart; base: Matrix4; direction: Vector3 }>;
    home: { position: Vector3; target: Vector3 };
    /** What the camera was last framed on. */
    framing: string;
    draw: () => void;
  } | null>(null);
  const [failed, setFailed] = useState<string | null>(null);

  // The renderer, camera and controls live as long as the component.
  useEffect(() => {
    const el = canvas.current!;
    let renderer: WebGLRenderer;
    try {
      renderer = new WebGLRenderer({ canvas: el, antialias: false, preserveDrawingBuffer: true });
    } catch (err) {
      setFailed('This computer could not start 3D drawing (WebGL).');
      return;
    }
    renderer.setPixelRatio(Math.min(window.devicePixelRatio, 2));
    const scene = new Scene();
    const camera = new PerspectiveCamera(35, 1, 0.1, 10000);
    scene.add(new HemisphereLight(0xffffff, 0x6b6355, 1.4));
    scene.add(new AmbientLight(0xffffff, 0.25));
    const key = new DirectionalLight(0xffffff, 1.6);
    key.position.set(1, 1.5, 2);
    camera.add(key);
    scene.add(camera);
    const group = new Group();
    scene.add(group);
    const controls = new OrbitControls(camera, el);
    controls.enableDamping = false;
    const draw = (): void => renderer.render(scene, camera);
    controls.addEventListener('change', draw);
    const resize = (): void => {
      const w = el.clientWidth || 300;
      const h = el.clientHeight || 300;
      renderer.setSize(w, h, false);
      camera.aspect = w / h;
      camera.updateProjectionMatrix();
      draw();
    };
    const observer = new ResizeObserver(resize);
    observer.observe(el);
    state.current = { renderer, scene, camera, controls, group, meshes: new Map(), home: { position: new Vector3(), target: new Vector3() }, framing: '', draw };
    resize();
    return () => {
      observer.disconnect();
      controls.dispose();
      for (const m of state.current?.meshes.values() ?? []) {
        m.mesh.geometry.dispose();
        (m.mesh.material as MeshLambertMaterial).dispose();
      }
      renderer.dispose();
      state.current = null;
    };
  }, []);

  useEffect(() => {
    if (state.current) state.current.scene.background = new Color(props.background);
    state.current?.draw();
  }, [props.background]);

  // Parts: rebuilt when the parts or the selection change.
  const selKey = props.selectedRegion ? `${props.selectedRegion.part}:${props.selectedRegion.region}` : '';
  useEffect(() => {
    const s = state.current;
    if (!s) return;
    for (const m of s.meshes.values()) {
      s.group.remove(m.mesh);
      m.mesh.geometry.dispose();
      (m.mesh.material as MeshLambertMaterial).dispose();
    }
    s.meshes.clear();
    const box = new Box3();
    const centres: Vector3[] = [];
    for (const part of props.parts) {
      const selected = props.selectedRegion && props.selectedRegion.part === part.key ? props.selectedRegion.region : null;
      const geometry = buildGeometry(part.mesh, { base: part.base, fractures: part.fractures ?? true, byClass: part.byClass, selectedRegion: selected, gaps: part.gaps });
      const material = new MeshLambertMaterial({ vertexColors: true });
      const mesh = new Mesh(geometry, material);
      const base = matrixFromRowMajor(part.transform);
      mesh.matrixAutoUpdate = false;
      mesh.matrix.copy(base);
      mesh.userData.part = part.key;
      s.group.add(mesh);
      mesh.updateMatrixWorld(true);
      const partBox = new Box3().setFromObject(mesh);
      box.union(partBox);
      centres.push(partBox.getCenter(new Vector3()));
      s.meshes.set(part.key, { mesh, part, base, direction: new Vector3() });
    }
    // Pull-apart direction: from the first part's centre towards each pulled part's centre.
    let i = 0;
    for (const m of s.meshes.values()) {
      m.direction.copy(centres[i]).sub(centres[0]);
      if (m.direction.lengthSq() < 1e-9) m.direction.set(1, 0, 0);
      m.direction.normalize();
      i++;
    }
    // Frame the parts when they are new to the view; a new selection or a recoloured scan
    // (after a correction) keeps the analyst's camera.
    const framing = props.parts.map((p) => `${p.key}:${p.mesh.positions.length}:${p.mesh.triangles.length}:${p.transform?.join(',') ?? ''}`).join('|');
    if (!box.isEmpty() && framing !== s.framing) {
      s.framing = framing;
      const sphere = box.getBoundingSphere(new Sphere());
      const dist = sphere.radius / Math.sin((s.camera.fov * Math.PI) / 360) * 1.15;
      s.camera.near = Math.max(0.01, dist / 100);
      s.camera.far = dist * 10;
      s.camera.updateProjectionMatrix();
      s.home.target.copy(sphere.center);
      s.home.position.copy(sphere.center).add(new Vector3(0.35, 0.45, 1).normalize().multiplyScalar(dist));
      s.camera.position.copy(s.home.position);
      s.controls.target.copy(s.home.target);
      s.controls.update();
    }
    applyPull(props.pullApart ?? 0);
    s.draw();
    // For the app benchmark: when a new set of parts was first drawn.
    if (props.parts.length) performance.mark('knitbone:scan-drawn', { detail: { triangles: props.parts.reduce((n, p) => n + p.mesh.triangles.length / 3, 0) } });
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [props.parts, selKey]);

  function applyPull(mm: number): void {
    const s = state.current;
    if (!s) return;
    for (const m of s.meshes.values()) {
      const offset = m.part.pulls ? new Matrix4().makeTranslation(m.direction.x * mm, m.direction.y * mm, m.direction.z * mm) : new Matrix4();
      m.mesh.matrix.copy(offset.multiply(m.base));
      m.mesh.updateMatrixWorld(true);
    }
  }

  useEffect(() => {
    applyPull(props.pullApart ?? 0);
    state.current?.draw();
  }, [props.pullApart]);

  function onKeyDown(e: React.KeyboardEvent): void {
    const s = state.current;
    if (!s) return;
    const step = Math.PI / 24;
    const offset = s.camera.position.clone().sub(s.controls.target);
    if (e.key === 'ArrowLeft' || e.key === 'ArrowRight') offset.applyAxisAngle(new Vector3(0, 1, 0), e.key === 'ArrowLeft' ? -step : step);
    else if (e.key === 'ArrowUp' || e.key === 'ArrowDown') {
      const axis = new Vector3().crossVectors(offset, s.camera.up).normalize();
      offset.applyAxisAngle(axis, e.key === 'ArrowUp' ? step : -step);
    } else if (e.key === '+' || e.key === '=') offset.multiplyScalar(0.85);
    else if (e.key === '-') offset.multiplyScalar(1 / 0.85);
    else if (e.key === '0') {
      s.camera.position.copy(s.home.position);
      s.controls.target.copy(s.home.target);
      s.controls.update();
      s.draw();
      e.preventDefault();
      return;
    } else return;
    e.preventDefault();
    s.camera.position.copy(s.controls.target).add(offset);
    s.camera.lookAt(s.controls.target);
    s.controls.update();
    s.draw();
  }

  function onClick(e: React.MouseEvent): void {
    const s = state.current;
    if (!s || !props.onSelectRegion) return;
    const rect = canvas.current!.getBoundingClientRect();
    const ndc = new Vector2(((e.clientX - rect.left) / rect.width) * 2 - 1, -((e.clientY - rect.top) / rect.height) * 2 + 1);
    const ray = new Raycaster();
    ray.setFromCamera(ndc, s.camera);
    const hit = ray.intersectObjects([...s.meshes.values()].map((m) => m.mesh), false)[0];
    if (!hit || hit.faceIndex === undefined || hit.faceIndex === null) return props.onSelectRegion(null);
    const key = hit.object.userData.part as string;
    const part = s.meshes.get(key)?.part;
    const region = part?.mesh.triangleRegions?.[hit.faceIndex] ?? -1;
    props.onSelectRegion(region >= 0 ? { part: key, region } : null);
  }

  if (failed) return <p className="empty">{failed}</p>;
  return (
    <div className="viewer" style={{ height: props.height ?? 420 }}>
      <canvas
        ref={canvas}
        tabIndex={0}
        role="img"
        aria-label={`${props.label}. Arrow keys turn, plus and minus zoom, 0 resets.`}
        onKeyDown={onKeyDown}
        onClick={onClick}
      />
    </div>
  );
}
