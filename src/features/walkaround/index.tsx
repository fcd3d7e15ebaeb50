import { Placeholder } from '../../components/placeholder';

/** Screen entry, lazy-loaded by the router. */
export default function Screen() {
  return <Placeholder title="Walkaround" what="This screen is being built." />;
}
