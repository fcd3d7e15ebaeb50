/**
 * Table rows are parts as a person names them under each unit's own F: the stored
 * pin label ("Left side, #1 traction motor"). Labels are derived from the front, so the
 * #1 motor of a unit with the F on the short hood and the #1 motor of a unit with the F
 * on the long hood (physically the sixth from the short hood) read the same and land in
 * the same row. Grouping by instance id, part id (one per view) or body coordinates
 * would split them; the row never depends on the view the pin was tapped in either.
 */

export interface RowPart {
  readonly partKind: string;
  /** The part's own label without a pin side ("#1 traction motor"). */
  readonly partLabel: string;
}

export interface LayoutPartLike {
  readonly instanceId: string;
  readonly kind: string;
  readonly label: string;
}

/**
 * The instance a row names on a layout of the same unit type (the front-first drawing),
 * matched by kind and part label; both are derived from the front, so the match holds
 * whichever way the layout's F lies.
 */
export function instanceForRow(row: RowPart, parts: readonly LayoutPartLike[]): string | null {
  return parts.find((p) => p.kind === row.partKind && p.label === row.partLabel)?.instanceId ?? null;
}
