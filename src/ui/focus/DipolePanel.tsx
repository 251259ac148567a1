/** The fitted equivalent dipole in three views, with residual variance, approximate region and caution. */
import type { DipoleEvidence } from '../../core/evidence/types.ts';
import { ExportablePanel } from '../export/ExportablePanel.tsx';
import { DIPOLE_CAUTION, DipoleViews } from '../plots/DipoleViews.tsx';

export function DipolePanel({ dipole, context }: { dipole: DipoleEvidence | null; context: string }) {
  return (
    <ExportablePanel title="Equivalent dipole" context={context} className="panel-dipole">
      {dipole ? (
        <DipoleViews dipole={dipole} />
      ) : (
        <p>
          No dipole was fitted for this component. <span className="caution">{DIPOLE_CAUTION}</span>
        </p>
      )}
    </ExportablePanel>
  );
}
