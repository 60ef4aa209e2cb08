// The drawing surface: a Konva stage sized to its box. It draws what it is given and forwards
// every pointer, wheel and key input as a plain editor event in WORLD coordinates (plus the screen
// position) — the editor owns tools, hit-testing, snapping and the camera (pan, zoom to cursor).
import { useEffect, useLayoutEffect, useRef, useState, type CSSProperties, type ReactNode } from 'react';
import { Stage } from 'react-konva';
import { screenToWorld, type Camera, type Point } from './camera';
import type { Button, EditorEvent } from '../editor/types';

export const PART_DRAG_TYPE = 'application/x-polesketch-symbol';

interface Props {
  camera: Camera;
  onEvent: (ev: EditorEvent) => boolean;
  onSize?: (size: { width: number; height: number }) => void;
  /** A palette item dragged over / dropped on the sheet (world position of the pointer). */
  onPartDragOver?: (world: Point, screen: Point) => void;
  onPartDrop?: (world: Point, screen: Point) => void;
  onFileDrop?: (file: File) => void;
  cursor?: string;
  children: (size: { width: number; height: number }) => ReactNode;
  /** HTML drawn above the stage (zoom buttons, banners). */
  overlay?: ReactNode;
  /** Background of the sheet under the stage (the grid). */
  backdrop?: CSSProperties;
}

function asButton(b: number): Button {
  return b === 1 ? 1 : b === 2 ? 2 : 0;
}

export function Sheet({ camera, onEvent, onSize, onPartDragOver, onPartDrop, onFileDrop, cursor, children, overlay, backdrop }: Props) {
  const box = useRef<HTMLDivElement>(null);
  const [size, setSize] = useState({ width: 800, height: 600 });
  const [fileOver, setFileOver] = useState(false);
  const camRef = useRef(camera);
  camRef.current = camera;
  const onEventRef = useRef(onEvent);
  onEventRef.current = onEvent;

  useLayoutEffect(() => {
    const el = box.current;
    if (!el) return;
    const measure = () => {
      const r = el.getBoundingClientRect();
      const next = { width: Math.max(1, Math.round(r.width)), height: Math.max(1, Math.round(r.height)) };
      setSize((s) => (s.width === next.width && s.height === next.height ? s : next));
    };
    measure();
    if (typeof ResizeObserver === 'undefined') return;
    const ro = new ResizeObserver(measure);
    ro.observe(el);
    return () => ro.disconnect();
  }, []);

  useEffect(() => { onSize?.(size); }, [size, onSize]);

  const local = (clientX: number, clientY: number): Point => {
    const r = box.current?.getBoundingClientRect();
    return { x: clientX - (r?.left ?? 0), y: clientY - (r?.top ?? 0) };
  };
  const where = (e: { clientX: number; clientY: number }) => {
    const s = local(e.clientX, e.clientY);
    const w = screenToWorld(camRef.current, s);
    return { x: w.x, y: w.y, sx: s.x, sy: s.y };
  };
  const mods = (e: { shiftKey: boolean; ctrlKey: boolean; altKey: boolean; metaKey: boolean }) => ({
    shift: e.shiftKey, ctrl: e.ctrlKey, alt: e.altKey, meta: e.metaKey,
  });

  // Wheel must be non-passive so the page does not scroll while zooming.
  useEffect(() => {
    const el = box.current;
    if (!el) return;
    const onWheel = (e: WheelEvent) => {
      e.preventDefault();
      const s = local(e.clientX, e.clientY);
      onEventRef.current({ type: 'wheel', sx: s.x, sy: s.y, deltaY: e.deltaY, ...mods(e) });
    };
    el.addEventListener('wheel', onWheel, { passive: false });
    return () => el.removeEventListener('wheel', onWheel);
  }, []);

  return (
    <div
      ref={box}
      className="sheet"
      tabIndex={0}
      role="application"
      aria-label="Drawing surface"
      data-testid="sheet"
      style={{ ...backdrop, cursor }}
      onPointerDown={(e) => {
        box.current?.focus({ preventScroll: true });
        if (e.button === 1) e.preventDefault();
        (e.target as Element).setPointerCapture?.(e.pointerId);
        onEvent({ type: 'pointerDown', ...where(e), button: asButton(e.button), detail: e.detail, ...mods(e) });
      }}
      onPointerMove={(e) => onEvent({ type: 'pointerMove', ...where(e), ...mods(e) })}
      onPointerUp={(e) => onEvent({ type: 'pointerUp', ...where(e), button: asButton(e.button), ...mods(e) })}
      onPointerLeave={() => onEvent({ type: 'pointerLeave' })}
      onDoubleClick={(e) => { const w = where(e); onEvent({ type: 'doubleClick', x: w.x, y: w.y, ...mods(e) }); }}
      onAuxClick={(e) => e.preventDefault()}
      onContextMenu={(e) => e.preventDefault()}
      onDragOver={(e) => {
        const types = Array.from(e.dataTransfer.types);
        if (types.includes(PART_DRAG_TYPE)) {
          e.preventDefault();
          e.dataTransfer.dropEffect = 'copy';
          const w = where(e);
          onPartDragOver?.({ x: w.x, y: w.y }, { x: w.sx, y: w.sy });
        } else if (types.includes('Files')) {
          e.preventDefault();
          e.dataTransfer.dropEffect = 'copy';
          setFileOver(true);
        }
      }}
      onDragLeave={(e) => {
        if (!box.current?.contains(e.relatedTarget as Node | null)) setFileOver(false);
      }}
      onDrop={(e) => {
        setFileOver(false);
        if (Array.from(e.dataTransfer.types).includes(PART_DRAG_TYPE)) {
          e.preventDefault();
          const w = where(e);
          onPartDrop?.({ x: w.x, y: w.y }, { x: w.sx, y: w.sy });
          return;
        }
        const file = e.dataTransfer.files?.[0];
        if (file && onFileDrop) { e.preventDefault(); onFileDrop(file); }
      }}
    >
      <Stage width={size.width} height={size.height} x={camera.x} y={camera.y} scaleX={camera.scale} scaleY={camera.scale} listening={false}>
        {children(size)}
      </Stage>
      {overlay}
      {fileOver && <div className="drop-veil">Drop a saved drawing (.json) to open it</div>}
    </div>
  );
}
