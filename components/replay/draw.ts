/** Renders the painters' plain shapes on a 2D canvas context (the only place the replay draws). */
import type { Shape, Style } from "./painters/shapes";

type Ctx = CanvasRenderingContext2D;

function trace(ctx: Ctx, a: ArrayLike<number>, closed: boolean) {
  if (a.length < 2) return;
  ctx.moveTo(a[0], a[1]);
  for (let i = 2; i + 1 < a.length; i += 2) ctx.lineTo(a[i], a[i + 1]);
  if (closed) ctx.closePath();
}

function finish(ctx: Ctx, s: Style) {
  if (s.fill) {
    ctx.fillStyle = s.fill;
    ctx.fill();
  }
  if (s.stroke) {
    ctx.strokeStyle = s.stroke;
    ctx.lineWidth = s.width ?? 1;
    ctx.lineCap = s.cap ?? "butt";
    ctx.lineJoin = s.join ?? "miter";
    ctx.setLineDash(s.dash ?? []);
    ctx.stroke();
    if (s.dash) ctx.setLineDash([]);
  }
}

export function drawShapes(ctx: Ctx, shapes: readonly Shape[]): void {
  for (const s of shapes) {
    switch (s.kind) {
      case "lines":
        ctx.beginPath();
        for (const p of s.paths) trace(ctx, p, !!s.closed);
        finish(ctx, s);
        break;
      case "circle":
        ctx.beginPath();
        ctx.arc(s.x, s.y, s.r, 0, Math.PI * 2);
        finish(ctx, s);
        break;
      case "dots":
        ctx.beginPath();
        for (let i = 0; i + 1 < s.points.length; i += 2) {
          ctx.moveTo(s.points[i] + s.r, s.points[i + 1]);
          ctx.arc(s.points[i], s.points[i + 1], s.r, 0, Math.PI * 2);
        }
        ctx.fillStyle = s.fill;
        ctx.fill();
        break;
      case "rect":
        if (s.fill) {
          ctx.fillStyle = s.fill;
          ctx.fillRect(s.x, s.y, s.w, s.h);
        }
        if (s.stroke) {
          ctx.strokeStyle = s.stroke;
          ctx.lineWidth = s.width ?? 1;
          ctx.setLineDash(s.dash ?? []);
          ctx.strokeRect(s.x, s.y, s.w, s.h);
          if (s.dash) ctx.setLineDash([]);
        }
        break;
      case "text":
        ctx.fillStyle = s.fill;
        ctx.font = s.font;
        ctx.textAlign = s.align;
        ctx.textBaseline = s.baseline;
        ctx.fillText(s.text, s.x, s.y);
        break;
      case "clip":
        ctx.save();
        ctx.beginPath();
        ctx.rect(s.x, s.y, s.w, s.h);
        ctx.clip();
        drawShapes(ctx, s.shapes);
        ctx.restore();
        break;
    }
  }
}
