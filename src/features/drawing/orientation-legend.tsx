import type { FrontEnd } from '../../../shared/domain/frames';

/**
 * How Hoodline names places on a unit, in our words. Shown beside drawings and in the lab;
 * `frontEnd` adds a line saying where this unit's F is.
 */
export function OrientationLegend({ frontEnd, compact = false }: { frontEnd?: FrontEnd; compact?: boolean }) {
  return (
    <section aria-label="How the unit is named" className="card space-y-2 p-4 text-base">
      <h2 className="label">Front, sides and numbers</h2>
      <ul className="list-disc space-y-1 pl-5">
        <li>
          The end with the <strong>F</strong> is the <strong>front</strong>; the other end is the rear.
        </li>
        <li>
          Stand in the cab facing the F: your left hand points to the <strong>left side</strong>, your right hand to the right side.
        </li>
        <li>
          Repeated parts (axles, traction motors, trucks, wheels, sand boxes) are counted <strong>1, 2, 3 …</strong> from the front;
          parts that come in pairs are counted on each side.
        </li>
        {!compact && (
          <li>
            Most units carry the F on the short hood. When it is on the long hood, front and rear, left and right and every number
            change over: the same motor is #1 on one unit and #6 on the other. Hoodline works the names out; nobody types them.
          </li>
        )}
        {frontEnd && (
          <li>
            This unit carries its F on the <strong>{frontEnd === 'short_hood' ? 'short hood' : 'long hood'}</strong>.
          </li>
        )}
      </ul>
    </section>
  );
}
