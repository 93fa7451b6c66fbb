/**
 * `npm run print-check [-- file.xlsx …]`: how many pages each sheet of an export prints on.
 *
 * Each sheet is saved as a workbook of its own and converted to PDF by LibreOffice
 * (`soffice --headless --convert-to pdf`), once as exported and once with its print layout
 * removed (portrait, 100 %, no print area: what a sheet without one prints on), and the pages of
 * each PDF are counted. Without arguments it checks the sample study workbook of the export
 * tests (an invented coil, test/unit/export/support.ts) with 200 trials.
 *
 * LibreOffice is large and not part of `npm test`: when `soffice` is missing and we are root,
 * this script installs Debian's `libreoffice-calc-nogui` (apt-get), else it says how to.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import ExcelJS from 'exceljs';

const INSTALL = ['apt-get', 'install', '-y', '--no-install-recommends', 'libreoffice-calc-nogui'];

function soffice(): string {
  const found = ['soffice', 'libreoffice'].find((cmd) => spawnSync('sh', ['-c', `command -v ${cmd}`]).status === 0);
  if (found) return found;
  if (process.getuid?.() !== 0) throw new Error(`LibreOffice is missing: install it with \`sudo ${INSTALL.join(' ')}\``);
  console.log(`▸ LibreOffice is missing: ${INSTALL.join(' ')} (Debian's package, a few hundred MB)`);
  spawnSync('apt-get', ['update'], { stdio: 'inherit' });
  if (spawnSync(INSTALL[0], INSTALL.slice(1), { stdio: 'inherit' }).status !== 0) throw new Error('apt-get could not install libreoffice-calc-nogui');
  return 'soffice';
}

/** Pages of a PDF: its page objects (`/Type /Page`, not `/Pages`), as LibreOffice writes them. */
export function pdfPages(pdf: Buffer): number {
  return (pdf.toString('latin1').match(/\/Type\s*\/Page(?![a-z])/g) ?? []).length;
}

async function sample(): Promise<{ name: string; bytes: Buffer }> {
  const { study, trials } = await import('../test/unit/export/support');
  const { studyWorkbook } = await import('../app/_lib/exports/study-workbook');
  const spec = study('si');
  // 200 trials: the 9 of the sample, repeated with their own ids (a long day of testing)
  const many = Array.from({ length: 200 }, (_, i) => ({ ...trials[i % trials.length], id: `T${i + 1}`, order: i + 1 }));
  return { name: 'sample study (200 trials)', bytes: await studyWorkbook({ ...spec, trials: many }) };
}

/** One workbook per sheet: [sheet name, bytes as exported, bytes without a print layout]. */
async function perSheet(bytes: Buffer): Promise<[string, Buffer, Buffer][]> {
  const probe = new ExcelJS.Workbook();
  await probe.xlsx.load(bytes as unknown as ArrayBuffer);
  const out: [string, Buffer, Buffer][] = [];
  for (const keep of probe.worksheets.map((w) => w.name)) {
    const copy = async (plain: boolean) => {
      const wb = new ExcelJS.Workbook();
      await wb.xlsx.load(bytes as unknown as ArrayBuffer);
      for (const ws of [...wb.worksheets]) if (ws.name !== keep) wb.removeWorksheet(ws.id);
      if (plain) {
        const ws = wb.worksheets[0];
        ws.pageSetup = { ...ws.pageSetup, fitToPage: false, orientation: 'portrait', scale: 100, printArea: undefined, printTitlesRow: undefined };
      }
      return Buffer.from((await wb.xlsx.writeBuffer()) as ArrayBuffer);
    };
    out.push([keep, await copy(false), await copy(true)]);
  }
  return out;
}

async function main() {
  const office = soffice();
  const inputs = process.argv.slice(2).length
    ? process.argv.slice(2).map((f) => ({ name: f, bytes: readFileSync(f) }))
    : [await sample()];
  const dir = mkdtempSync(path.join(os.tmpdir(), 'emberline-print-'));
  try {
    for (const input of inputs) {
      const sheets = await perSheet(input.bytes);
      const files: string[] = [];
      sheets.forEach(([, asExported, plain], i) => {
        for (const [kind, b] of [['print', asExported], ['plain', plain]] as const) {
          const f = path.join(dir, `s${i}-${kind}.xlsx`);
          writeFileSync(f, b);
          files.push(f);
        }
      });
      const r = spawnSync(office, [`-env:UserInstallation=file://${path.join(dir, 'profile')}`, '--headless', '--convert-to', 'pdf', '--outdir', dir, ...files], { encoding: 'utf8' });
      if (r.status !== 0) throw new Error(`LibreOffice failed: ${(r.stderr || r.stdout).trim().split('\n').slice(-3).join(' | ')}`);
      const pages = (i: number, kind: string) => pdfPages(readFileSync(path.join(dir, `s${i}-${kind}.pdf`)));
      console.log(`\n${input.name}`);
      console.log(`  ${'sheet'.padEnd(14)} ${'pages'.padStart(5)}  ${'without the print layout'}`);
      let total = 0, totalPlain = 0;
      sheets.forEach(([name], i) => {
        const [p, q] = [pages(i, 'print'), pages(i, 'plain')];
        total += p;
        totalPlain += q;
        console.log(`  ${name.padEnd(14)} ${String(p).padStart(5)}  ${String(q).padStart(5)}`);
      });
      console.log(`  ${'all sheets'.padEnd(14)} ${String(total).padStart(5)}  ${String(totalPlain).padStart(5)}`);
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

main().catch((e) => {
  console.error(`✖ ${e instanceof Error ? e.message : String(e)}`);
  process.exit(1);
});
