/**
 * The C header of a whole design (parts, test limits, trim table, analog and digital sections) compiles
 * with gcc -std=c99 -Wall -Wextra -Wpedantic -Werror and g++ -std=c++11 -Wall -Wextra -Werror, and
 * every part value the program prints (raw IEEE bits) equals the design's value rounded to float.
 */
import { describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { designFilter, productionOutputs, toCHeader } from '../../src/spec/index';
import { haveTool, IN_CI, toolTitle } from '../export/helpers/toolchain';

const HAVE = haveTool('gcc') && haveTool('g++');
const floatBits = (x: number): number => {
  const b = new DataView(new ArrayBuffer(4));
  b.setFloat32(0, x);
  return b.getUint32(0);
};

describe.skipIf(!HAVE && !IN_CI)(toolTitle('the header of a designed filter compiles and carries its values bit for bit', ['gcc', 'g++'], HAVE), () => {
  it('for the worked example, with production test limits and the trim table', () => {
    const spec = JSON.parse(readFileSync(join(__dirname, '..', '..', 'examples', 'vibration-antialias-lowpass.json'), 'utf8'));
    spec.production = { ...spec.production, trials: 500 };
    const design = designFilter(spec);
    const header = toCHeader(design, productionOutputs(design)!.headerExtras);
    const dir = mkdtempSync(join(tmpdir(), 'gicladder-hdr-'));
    writeFileSync(join(dir, 'filter.h'), header);
    const program = `#include <stdio.h>
#include <string.h>
#include <stdint.h>
#include "filter.h"
int main(void) {
  unsigned i;
  for (i = 0; i < VIB_AAF_PART_COUNT; i++) { uint32_t u; memcpy(&u, &VIB_AAF_PART_VALUES_SI[i], 4); printf("%s %08x\\n", VIB_AAF_PART_NAMES[i], (unsigned)u); }
  printf("trim %d %d\\n", (int)VIB_AAF_TRIM_CODE_COUNT, (int)VIB_AAF_TRIM_DEFAULT_CODE);
  return 0;
}
`;
    writeFileSync(join(dir, 'main.c'), program);
    writeFileSync(join(dir, 'main.cpp'), program);
    execFileSync('gcc', ['-std=c99', '-Wall', '-Wextra', '-Wpedantic', '-Werror', '-o', join(dir, 'c'), join(dir, 'main.c')], { cwd: dir });
    execFileSync('g++', ['-std=c++11', '-Wall', '-Wextra', '-Werror', '-o', join(dir, 'cpp'), join(dir, 'main.cpp')], { cwd: dir });
    for (const exe of ['c', 'cpp']) {
      const out = execFileSync(join(dir, exe), { encoding: 'utf8' }).trim().split('\n');
      const parts = out.slice(0, -1).map((l) => l.split(' '));
      expect(parts.map((p) => p[0])).toEqual(design.parts.map((p) => p.name));
      parts.forEach(([, hex], i) => expect(parseInt(hex, 16)).toBe(floatBits(design.parts[i].value)));
      expect(out[out.length - 1]).toBe(`trim ${spec.trim.device.steps + 1} ${Math.round(spec.trim.device.steps / 2)}`);
    }
  }, 120_000);
});
