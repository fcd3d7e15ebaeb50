import { Placeholder } from '../../components/placeholder';

/** Screen entry, lazy-loaded by the router. */
export default function Screen() {
  return <Placeholder title="Repair queue" what="This screen is being built." />;
}
