"use client";

import { OrbitControls } from "@react-three/drei";
import { Canvas } from "@react-three/fiber";
import { useQuery } from "@tanstack/react-query";
import { useEffect, useMemo, useState } from "react";
import * as THREE from "three";
import { mergeVertices } from "three/examples/jsm/utils/BufferGeometryUtils.js";
import { orientPositions } from "@/lib/estimating/orient";
import type { Orientation } from "@/lib/estimating/types";
import { formatLength, formatSize, type UnitsPref } from "@/lib/units";

export interface PartViewerProps {
  revisionId: string;
  /** The file's units as confirmed (or guessed), so the preview is drawn in millimetres. */
  fileUnits: "mm" | "in";
  displayUnits: UnitsPref;
  orientation: Orientation;
  envelopeMm: { x: number; y: number; z: number } | null;
  cellName: string | null;
  allowanceMm: number;
}

type Loaded = { status: "loading" } | { status: "error"; message: string } | { status: "ready"; positions: Float32Array; triangles: number };

function useMesh(revisionId: string, units: "mm" | "in"): Loaded {
  const q = useQuery({
    queryKey: ["mesh", revisionId, units],
    queryFn: async () => {
      const res = await fetch(`/api/portal/revisions/${revisionId}/mesh?units=${units}`);
      if (!res.ok) throw new Error(((await res.json().catch(() => null)) as { error?: { message?: string } } | null)?.error?.message ?? `The server answered ${res.status}.`);
      const buf = await res.arrayBuffer();
      return { positions: new Float32Array(buf), triangles: Number(res.headers.get("x-triangles") ?? buf.byteLength / 36) };
    },
    staleTime: Infinity,
    retry: 1,
  });
  if (q.isError) return { status: "error", message: q.error.message };
  if (!q.data) return { status: "loading" };
  return { status: "ready", ...q.data };
}

/** Build-space geometry (z up), moved so the part sits on the bed at the envelope's centre. */
function buildGeometries(positions: Float32Array, orientation: Orientation, envelope: { x: number; y: number; z: number } | null, allowanceMm: number) {
  const p = orientPositions(positions, orientation);
  const g = new THREE.BufferGeometry();
  g.setAttribute("position", new THREE.BufferAttribute(p.slice(), 3));
  g.computeBoundingBox();
  const bb = g.boundingBox!;
  const size = new THREE.Vector3();
  bb.getSize(size);
  const cx = envelope ? envelope.x / 2 : size.x / 2;
  const cy = envelope ? envelope.y / 2 : size.y / 2;
  g.translate(cx - (bb.min.x + size.x / 2), cy - (bb.min.y + size.y / 2), allowanceMm - bb.min.z);
  g.computeVertexNormals();

  // The near-net shell drawn by moving each welded vertex out along its normal by the allowance
  // (a picture of the offset; the engine computes the grown volume exactly for the estimate).
  let shell: THREE.BufferGeometry | null = null;
  if (allowanceMm > 0) {
    const welded = mergeVertices(g.clone().deleteAttribute("normal"), Math.max(1e-4, size.length() * 1e-6));
    welded.computeVertexNormals();
    const pos = welded.getAttribute("position") as THREE.BufferAttribute;
    const nrm = welded.getAttribute("normal") as THREE.BufferAttribute;
    for (let i = 0; i < pos.count; i++) {
      pos.setXYZ(i, pos.getX(i) + nrm.getX(i) * allowanceMm, pos.getY(i) + nrm.getY(i) * allowanceMm, pos.getZ(i) + nrm.getZ(i) * allowanceMm);
    }
    welded.computeVertexNormals();
    shell = welded;
  }
  return { part: g, shell, size: [size.x, size.y, size.z] as [number, number, number] };
}

/** The 3D preview: the part on the chosen cell's bed, its envelope and the near-net shell. */
export function PartViewer({ revisionId, fileUnits, displayUnits, orientation, envelopeMm, cellName, allowanceMm }: PartViewerProps) {
  const mesh = useMesh(revisionId, fileUnits);
  const [showShell, setShowShell] = useState(true);
  const [showEnvelope, setShowEnvelope] = useState(true);
  const geo = useMemo(
    () => (mesh.status === "ready" ? buildGeometries(mesh.positions, orientation, envelopeMm, allowanceMm) : null),
    [mesh, orientation, envelopeMm, allowanceMm],
  );
  useEffect(() => () => {
    geo?.part.dispose();
    geo?.shell?.dispose();
  }, [geo]);

  const span = envelopeMm ? Math.max(envelopeMm.x, envelopeMm.y, envelopeMm.z) : geo ? Math.max(...geo.size) : 1000;
  const centre: [number, number, number] = envelopeMm ? [envelopeMm.x / 2, envelopeMm.z / 3, -envelopeMm.y / 2] : geo ? [geo.size[0] / 2, geo.size[2] / 2, -geo.size[1] / 2] : [0, 0, 0];

  return (
    <figure className="overflow-hidden rounded-md bg-ink-900 ring-1 ring-ink-700" aria-label="3D preview of the part">
      <div className="relative h-72 sm:h-96" data-testid="part-viewer">
        {mesh.status === "loading" ? <p className="absolute inset-0 grid place-items-center text-sm text-paper-300">Loading the 3D preview…</p> : null}
        {mesh.status === "error" ? (
          <p role="alert" className="absolute inset-0 grid place-items-center px-6 text-center text-sm text-red-200">
            The preview could not be drawn: {mesh.message}
          </p>
        ) : null}
        {geo ? (
          <Canvas
            camera={{ position: [centre[0] + span * 0.9, span * 0.7, centre[2] + span * 1.1], near: span / 1000, far: span * 20, fov: 40 }}
            gl={{ preserveDrawingBuffer: true, antialias: true }}
            data-ready="true"
          >
            <color attach="background" args={["#181d23"]} />
            <hemisphereLight args={["#f4f1ea", "#242b33", 1.1]} />
            <directionalLight position={[span, span * 2, span]} intensity={1.6} />
            {/* Build space is z-up; three.js is y-up. */}
            <group rotation={[-Math.PI / 2, 0, 0]}>
              <mesh geometry={geo.part}>
                <meshStandardMaterial color="#d6cfbf" metalness={0.05} roughness={0.7} />
              </mesh>
              {showShell && geo.shell ? (
                <mesh geometry={geo.shell}>
                  <meshStandardMaterial color="#e98a4c" transparent opacity={0.28} depthWrite={false} side={THREE.DoubleSide} />
                </mesh>
              ) : null}
              {showEnvelope && envelopeMm ? (
                <lineSegments position={[envelopeMm.x / 2, envelopeMm.y / 2, envelopeMm.z / 2]}>
                  <edgesGeometry args={[new THREE.BoxGeometry(envelopeMm.x, envelopeMm.y, envelopeMm.z)]} />
                  <lineBasicMaterial color="#2c8a83" />
                </lineSegments>
              ) : null}
              {envelopeMm ? (
                <mesh position={[envelopeMm.x / 2, envelopeMm.y / 2, -1]}>
                  <planeGeometry args={[envelopeMm.x, envelopeMm.y]} />
                  <meshStandardMaterial color="#242b33" />
                </mesh>
              ) : null}
            </group>
            <OrbitControls target={centre} enableDamping makeDefault />
          </Canvas>
        ) : null}
      </div>
      <figcaption className="flex flex-wrap items-center gap-x-5 gap-y-2 border-t border-ink-700 px-4 py-2 text-xs text-paper-200">
        {geo ? (
          <span data-testid="bounding-size">
            Bounding size as built: <strong className="figures text-white">{formatSize(geo.size, displayUnits)}</strong>
          </span>
        ) : null}
        {mesh.status === "ready" ? <span className="text-paper-300">{mesh.triangles.toLocaleString("en-US")} triangles</span> : null}
        <label className="inline-flex items-center gap-1.5">
          <input type="checkbox" checked={showShell} onChange={(e) => setShowShell(e.target.checked)} className="accent-kiln-500" />
          Near-net shell (+{formatLength(allowanceMm, displayUnits, 2)})
        </label>
        {envelopeMm ? (
          <label className="inline-flex items-center gap-1.5">
            <input type="checkbox" checked={showEnvelope} onChange={(e) => setShowEnvelope(e.target.checked)} className="accent-tide-500" />
            {cellName ?? "Cell"} envelope ({formatSize([envelopeMm.x, envelopeMm.y, envelopeMm.z], displayUnits)})
          </label>
        ) : null}
        <span className="text-paper-300 sm:ml-auto">Drag to orbit · scroll or pinch to zoom</span>
      </figcaption>
    </figure>
  );
}
