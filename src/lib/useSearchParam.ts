// One search parameter of the page's URL, for a view option a link should carry (chart limits, comparison,
// split): read, and set or removed in place, without a new history entry.
import { useSearchParams } from "react-router";

export function useSearchParam(name: string): [string | null, (value: string | null) => void] {
  const [params, setParams] = useSearchParams();
  const set = (value: string | null) => {
    const changed = new URLSearchParams(params);
    if (value === null) changed.delete(name);
    else changed.set(name, value);
    setParams(changed, { replace: true });
  };
  return [params.get(name), set];
}
