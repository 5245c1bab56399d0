import type { ModesBlockResult } from '../../../../core/index';
import { useUnits } from './units';

/**
 * What the effective-mass percentages are shares of: rᵀMr for the direction, the mass that moves
 * with a unit ground displacement. Mass at restrained DOFs is not in it, so for a supported span
 * it is less than the span's whole mass (and the first mode's share more than a continuous beam's
 * 8/π²).
 */
export function ParticipationNote({ result }: { result: ModesBlockResult }) {
  const units = useUnits();
  const p = result.participation;
  if (!p) {
    // The Γ, effective-mass and cumulative columns show "—": say why (the engine's reason, or
    // for results before it gave one, the usual one) and what to write.
    return (
      <p className="text-xs text-ink-soft" data-testid="participation-reason">
        Γ, effective mass and cumulative are empty (—):{' '}
        {result.participationReason ?? (
          <>
            no influence direction. Give <code>direction:</code> a vector with one entry per DOF (
            <code>ones({result.size ?? 'n'})</code> when every DOF moves with the ground) or a
            direction name (<code>x</code>, <code>transverse</code>).
          </>
        )}
      </p>
    );
  }
  return (
    <p className="text-xs text-ink-faint">
      Effective masses are shares of rᵀMr = {units.text('mass', p.mass)} in the direction{' '}
      {p.direction}: the mass that moves with a unit ground displacement (mass at restrained DOFs is
      not in it).
    </p>
  );
}
