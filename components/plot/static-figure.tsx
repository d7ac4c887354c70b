"use client";

import { memo, useEffect, useId, useMemo, useRef, useState } from "react";
import {
  estimateText,
  type LineItem,
  layoutScene,
  type MeasureText,
  type RectItem,
  type StaticFigureInput,
} from "./static-scene";

export interface StaticFigureProps extends StaticFigureInput {
  /** Accessible name of the plot. */
  label: string;
  /** The size laid out on the server (and before the container is measured), in px. */
  nominal: { width: number; height: number };
  className?: string;
}

let canvas: HTMLCanvasElement | null = null;
/** Text widths from the browser's own font metrics (after hydration only: the server guesses). */
const measureInBrowser: MeasureText = (text, size, family) => {
  canvas ??= document.createElement("canvas");
  const ctx = canvas.getContext("2d");
  if (!ctx) return estimateText(text, size, family);
  ctx.font = `${size}px ${family}`;
  return ctx.measureText(text).width;
};

function isRect(item: LineItem | RectItem): item is RectItem {
  return "w" in item;
}

function Shape({ item }: { item: LineItem | RectItem }) {
  if (isRect(item)) {
    return (
      <rect
        x={item.x}
        y={item.y}
        width={item.w}
        height={item.h}
        fill={item.fill}
        stroke={item.stroke}
        strokeWidth={item.strokeWidth}
        opacity={item.opacity}
      />
    );
  }
  return (
    <line
      x1={item.x1}
      y1={item.y1}
      x2={item.x2}
      y2={item.y2}
      stroke={item.color}
      strokeWidth={item.width}
      strokeDasharray={item.dash}
      opacity={item.opacity}
    />
  );
}

/**
 * The figure drawn as plain SVG from the same data and layout the interactive chart gets: on the
 * server at a nominal size (a viewBox, scaled to fit), then at the container's real pixel size so
 * text is never scaled. No charting library involved.
 */
export const StaticFigure = memo(function StaticFigure({
  data,
  layout,
  label,
  nominal,
  className,
}: StaticFigureProps) {
  const ref = useRef<SVGSVGElement | null>(null);
  const clipBase = `pwc${useId().replace(/[^a-zA-Z0-9_-]/g, "")}`;
  const [size, setSize] = useState<{ width: number; height: number; measured: boolean }>({
    ...nominal,
    measured: false,
  });
  const [fontsReady, setFontsReady] = useState(0);
  useEffect(() => {
    const el = ref.current?.parentElement;
    if (!el) return;
    const update = () => {
      const r = el.getBoundingClientRect();
      if (r.width > 0 && r.height > 0) {
        setSize((s) =>
          s.measured && Math.abs(s.width - r.width) < 0.5 && Math.abs(s.height - r.height) < 0.5
            ? s
            : { width: r.width, height: r.height, measured: true },
        );
      }
    };
    update();
    const ro = new ResizeObserver(update);
    ro.observe(el);
    let live = true;
    void document.fonts?.ready.then(() => live && setFontsReady((n) => n + 1));
    return () => {
      live = false;
      ro.disconnect();
    };
  }, []);
  // Text is measured again once the app's fonts have loaded (fontsReady counts that moment).
  const measure = useMemo<MeasureText>(
    () => (fontsReady >= 0 && size.measured ? measureInBrowser : estimateText),
    [fontsReady, size.measured],
  );
  const scene = useMemo(
    () => layoutScene({ data, layout }, size.width, size.height, measure),
    [data, layout, size, measure],
  );
  return (
    <svg
      ref={ref}
      role="img"
      aria-label={label}
      data-static-plot=""
      className={className}
      width={size.measured ? size.width : "100%"}
      height={size.measured ? size.height : "100%"}
      viewBox={`0 0 ${scene.width} ${scene.height}`}
      preserveAspectRatio="xMidYMid meet"
      fontFamily={scene.font.family}
    >
      <defs>
        {scene.clips.map((c, i) => (
          // By index: two subplots can share one rectangle (a Δ axis over its row), and ids must stay unique.
          <clipPath key={`${clipBase}-${i}`} id={`${clipBase}-${i}`}>
            <rect x={c.x} y={c.y} width={c.w} height={c.h} />
          </clipPath>
        ))}
      </defs>
      {scene.plotBgs.map((r, i) => (
        <rect key={`bg${i}`} x={r.x} y={r.y} width={r.w} height={r.h} fill={r.fill} />
      ))}
      <g shapeRendering="crispEdges">
        {scene.grid.map((l, i) => (
          <line key={i} x1={l.x1} y1={l.y1} x2={l.x2} y2={l.y2} stroke={l.color} strokeWidth={l.width} />
        ))}
      </g>
      {scene.below.map((item, i) => (
        <Shape key={i} item={item} />
      ))}
      <g shapeRendering="crispEdges">
        {scene.zero.map((l, i) => (
          <line key={i} x1={l.x1} y1={l.y1} x2={l.x2} y2={l.y2} stroke={l.color} strokeWidth={l.width} />
        ))}
      </g>
      <g shapeRendering="crispEdges">
        {scene.axisLines.map((l, i) => (
          <line key={i} x1={l.x1} y1={l.y1} x2={l.x2} y2={l.y2} stroke={l.color} strokeWidth={l.width} />
        ))}
      </g>
      {scene.traces.map((t) => (
        <g
          key={t.index}
          clipPath={t.clip >= 0 ? `url(#${clipBase}-${t.clip})` : undefined}
          data-trace={t.index}
        >
          {t.bars.map((b, i) => (
            <rect
              key={i}
              x={b.x}
              y={b.y}
              width={b.w}
              height={b.h}
              fill={b.fill}
              stroke={b.stroke}
              strokeWidth={b.strokeWidth}
              data-bar=""
            />
          ))}
          {t.path ? (
            <path
              d={t.path}
              fill="none"
              stroke={t.color}
              strokeWidth={t.width}
              strokeDasharray={t.dash}
              strokeLinejoin="round"
              data-line=""
            />
          ) : null}
          {t.markers.map((m, i) => (
            <path
              key={i}
              transform={`translate(${m.x.toFixed(1)},${m.y.toFixed(1)})`}
              d={m.d}
              fill={m.fill}
              stroke={m.stroke}
              strokeWidth={m.strokeWidth}
            />
          ))}
        </g>
      ))}
      {scene.above.map((item, i) => (
        <Shape key={i} item={item} />
      ))}
      {scene.texts.map((t, i) => (
        <g key={i}>
          {t.box ? <rect x={t.box.x} y={t.box.y} width={t.box.w} height={t.box.h} fill={t.box.fill} /> : null}
          <text
            x={t.x}
            y={t.y}
            fontSize={t.size}
            fill={t.color}
            fontFamily={t.family}
            fontWeight={t.bold ? 700 : undefined}
            textAnchor={t.anchor}
            transform={t.rotate ? `rotate(${t.rotate} ${t.x} ${t.y})` : undefined}
          >
            {t.text}
          </text>
        </g>
      ))}
      {scene.legend.map((l, i) => (
        <g key={i}>
          {l.line ? (
            <line
              x1={l.x - 35}
              x2={l.x - 5}
              y1={l.y - l.size * 0.35}
              y2={l.y - l.size * 0.35}
              stroke={l.line.color}
              strokeWidth={l.line.width}
              strokeDasharray={l.line.dash}
            />
          ) : null}
          {l.bar ? (
            <rect x={l.x - 28} y={l.y - l.size * 0.35 - 6} width={12} height={12} fill={l.bar} />
          ) : null}
          {l.marker ? (
            <path
              transform={`translate(${l.marker.x},${l.marker.y})`}
              d={l.marker.d}
              fill={l.marker.fill}
              stroke={l.marker.stroke}
              strokeWidth={l.marker.strokeWidth}
            />
          ) : null}
          <text x={l.x} y={l.y} fontSize={l.size} fill={l.color}>
            {l.text}
          </text>
        </g>
      ))}
    </svg>
  );
});
