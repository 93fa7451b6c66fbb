/**
 * The Plans sheet: for each operating plan, its loop's facts and every step in order with the
 * cautions that arise at it (analysis/safety/operating-plan.ts, in words), the cautions in the
 * notice rows above the table as on every sheet, and the deferral to local codes.
 */
import { LOOP_LABELS, RELIEF_LABELS, stepText, type OperatingPlanDto } from '@/app/_contracts/operating-plan';
import { CAUTION_DEFER } from '@/analysis/safety/cautions';
import type { UnitSystem } from '@/analysis/units/unit-system';
import type { ExportColumn, ExportRow } from './columns';
import { cautionLines, sheetNotice } from './safety';
import type { SheetSpec } from './xlsx';

/** A plan as the export takes it. */
export type PlanExport = Pick<OperatingPlanDto, 'name' | 'rigName' | 'steps' | 'loop' | 'cautions'>;

/**
 * The Plans sheet of one or more operating plans.
 * @example planSheet([plan], 'si').rows[1] // { plan: 'Morning heat-up', rig: 'Stovepipe Coil A', step: 1, action: 'Cover off', caution: null }
 */
export function planSheet(plans: readonly PlanExport[], system: UnitSystem): SheetSpec {
  const columns: ExportColumn[] = [{ key: 'plan', header: 'Plan' }, { key: 'rig', header: 'Rig' }, { key: 'step', header: 'Step' }, { key: 'action', header: 'Action' }, { key: 'caution', header: 'Caution' }];
  const rows: ExportRow[] = [];
  for (const p of plans) {
    rows.push({ plan: p.name, rig: p.rigName, step: null, action: `${LOOP_LABELS[p.loop.loop]}; ${RELIEF_LABELS[p.loop.relief].toLowerCase()}`, caution: p.cautions.length ? `${p.cautions.length} caution(s)` : 'none' });
    p.steps.forEach((s, i) => {
      const at = p.cautions.filter((c) => c.step === i + 1);
      rows.push({ plan: p.name, rig: p.rigName, step: i + 1, action: stepText(s, system), caution: at.length ? at.map((c) => `${c.level === 'danger' ? 'Danger' : 'Warning'}: ${c.message.replace(CAUTION_DEFER, '').trim()}`).join(' ') : null });
    });
  }
  const extra = plans.flatMap((p) => cautionLines(p.cautions, `${p.name}: `));
  return { name: 'Plans', notice: sheetNotice(system, [], extra), columns, rows };
}
