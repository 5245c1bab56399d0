import { CAUTION } from '../../config/words';

export function Caution() {
  return (
    <p className="text-xs text-ink-faint">
      <span className="font-semibold text-ink-soft">Caution.</span> {CAUTION}
    </p>
  );
}
