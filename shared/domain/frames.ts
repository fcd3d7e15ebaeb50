/**
 * Coordinate frames. Branded so a carbody point can never be passed where a
 * front-relative or screen point is expected; convert only through the named
 * functions in shared/orientation.
 */
declare const brand: unique symbol;
type Brand<T, B extends string> = T & { readonly [brand]: B };

/** Carbody frame, inches: x from the short hood coupler face, +y right when facing the short hood from the cab, z above top of rail. */
export type BodyPoint = Brand<{ readonly x: number; readonly y: number; readonly z: number }, 'BodyPoint'>;
/** Front-relative frame, inches: `along` = distance from the front coupler face, `left` = offset to the left of the centreline, z above rail. */
export type FrontPoint = Brand<{ readonly along: number; readonly left: number; readonly z: number }, 'FrontPoint'>;
/** Screen pixels on a canvas. */
export type ScreenPoint = Brand<{ readonly sx: number; readonly sy: number }, 'ScreenPoint'>;

export const bodyPoint = (x: number, y: number, z = 0): BodyPoint => ({ x, y, z }) as BodyPoint;
export const frontPoint = (along: number, left: number, z = 0): FrontPoint => ({ along, left, z }) as FrontPoint;
export const screenPoint = (sx: number, sy: number): ScreenPoint => ({ sx, sy }) as ScreenPoint;

export const FRONT_ENDS = ['short_hood', 'long_hood'] as const;
export type FrontEnd = (typeof FRONT_ENDS)[number];

export type Side = 'left' | 'right' | 'center';
export type End = 'front' | 'rear';
/** The two physical ends of the carbody, independent of the F. */
export type BodyEnd = 'short_hood' | 'long_hood';

/** Views of the drawing, named in the carbody frame so they never change meaning when the F moves. */
export const VIEW_KEYS = ['plan', 'side_plus_y', 'side_minus_y', 'end_short_hood', 'end_long_hood'] as const;
export type ViewKey = (typeof VIEW_KEYS)[number];

/** Which two body axes a view shows, as (horizontal, vertical) of the sheet. */
export const VIEW_AXES: Record<ViewKey, readonly ['x' | 'y' | 'z', 'x' | 'y' | 'z']> = {
  plan: ['x', 'y'],
  side_plus_y: ['x', 'z'],
  side_minus_y: ['x', 'z'],
  end_short_hood: ['y', 'z'],
  end_long_hood: ['y', 'z'],
};
