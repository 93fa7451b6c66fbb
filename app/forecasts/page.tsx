import { AppPage } from '../_components/app-page';
import { requireLabAction } from '../_lib/accounts/viewer';
import { fitsOfLab } from '../_lib/fits/fits';
import { ForecastForm } from './forecast-form';
import { TubFill } from './tub-fill';

export const metadata = { title: 'Forecasts' };
export const dynamic = 'force-dynamic';

export default async function ForecastsPage() {
  const v = await requireLabAction('/forecasts', 'lab:read');
  const fits = await fitsOfLab(v.em, v.current.lab, { model: 'coil', limit: 50 });
  const collectors = await fitsOfLab(v.em, v.current.lab, { kind: 'collector', limit: 50 });
  const choices = [...fits.map((f) => ({ id: f.id, label: `${f.rig.name}: ${f.title} v${f.version}` })), ...collectors.map((f) => ({ id: f.id, label: `${f.rig.name}: ${f.title} v${f.version} (collector)`, collector: true }))];
  return (
    <AppPage
      viewer={v}
      title="Forecasts"
      lead="How fast a pool or tub warms: the pool feeds the heater, the coil model gives the outlet at every inlet temperature, and the weather takes heat away."
    >
      <ForecastForm labId={v.current.lab.id} units={v.user.unitSystem} fits={choices} />
      <TubFill labId={v.current.lab.id} units={v.user.unitSystem} fits={choices} />
    </AppPage>
  );
}
