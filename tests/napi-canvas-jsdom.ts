/**
 * Gives jsdom's <canvas> a real 2-D backend (@napi-rs/canvas), so Konva draws real pixels in
 * component tests: getImageData reads what was painted and cached nodes composite for real.
 * Import it first in a test file that needs it (jsdom alone has no getContext).
 */
import { createCanvas, type Canvas } from '@napi-rs/canvas';

const backing = new WeakMap<HTMLCanvasElement, Canvas>();
const proto = HTMLCanvasElement.prototype;
const widthDesc = Object.getOwnPropertyDescriptor(proto, 'width')!;
const heightDesc = Object.getOwnPropertyDescriptor(proto, 'height')!;

function backOf(el: HTMLCanvasElement): Canvas {
  let c = backing.get(el);
  if (!c) {
    c = createCanvas(Math.max(1, widthDesc.get!.call(el)), Math.max(1, heightDesc.get!.call(el)));
    backing.set(el, c);
  }
  return c;
}

Object.defineProperty(proto, 'width', {
  configurable: true,
  get: widthDesc.get,
  set(this: HTMLCanvasElement, v: number) {
    widthDesc.set!.call(this, v);
    backOf(this).width = Math.max(1, Math.floor(v));
  },
});
Object.defineProperty(proto, 'height', {
  configurable: true,
  get: heightDesc.get,
  set(this: HTMLCanvasElement, v: number) {
    heightDesc.set!.call(this, v);
    backOf(this).height = Math.max(1, Math.floor(v));
  },
});

const contexts = new WeakMap<Canvas, unknown>();
proto.getContext = function getContext(this: HTMLCanvasElement, kind: string) {
  if (kind !== '2d') return null;
  const c = backOf(this);
  let ctx = contexts.get(c) as ReturnType<Canvas['getContext']> | undefined;
  if (!ctx) {
    ctx = c.getContext('2d');
    const drawImage = ctx.drawImage.bind(ctx) as (...a: unknown[]) => void;
    // Konva composites cached nodes by drawing one DOM canvas into another: hand over the backing canvas.
    (ctx as unknown as { drawImage: (...a: unknown[]) => void }).drawImage = (img: unknown, ...rest: unknown[]) =>
      drawImage(img instanceof HTMLCanvasElement ? backOf(img) : img, ...rest);
    contexts.set(c, ctx);
  }
  return ctx as unknown as CanvasRenderingContext2D;
} as typeof proto.getContext;

proto.toDataURL = function toDataURL(this: HTMLCanvasElement) {
  return backOf(this).toDataURL('image/png');
};
