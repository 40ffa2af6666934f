import { InputError } from '../errors.js';
import { hockettSherby } from './hockettSherby.js';
import { hollomon } from './hollomon.js';
import { ludwik } from './ludwik.js';
import { LAW_NAMES } from './params.js';
import { swift } from './swift.js';
import { swiftVoce } from './swiftVoce.js';
import type { FlowLaw, LawSpec } from './types.js';
import { voce } from './voce.js';

/**
 * Builds a law from its spec, validating every parameter; errors name `path.param`.
 * @example makeLaw({ law: 'hollomon', K: 530, n: 0.44 }).uniformStrain() // 0.44
 */
export function makeLaw(spec: LawSpec, path = 'flowCurve'): FlowLaw {
  const law = build(spec, path);
  if (!(law.stress(0.1) > 0)) throw new InputError(path, spec, 'a law whose flow stress is above 0 (all stress parameters are 0)');
  return law;
}

function build(spec: LawSpec, path: string): FlowLaw {
  switch (spec.law) {
    case 'hollomon': return hollomon(spec, path);
    case 'ludwik': return ludwik(spec, path);
    case 'swift': return swift(spec, path);
    case 'voce': return voce(spec, path);
    case 'hockettSherby': return hockettSherby(spec, path);
    case 'swiftVoce': return swiftVoce(spec, path);
    default:
      throw new InputError(`${path}.law`, (spec as { law: unknown }).law, `one of ${LAW_NAMES.join(', ')}`);
  }
}

/** The spec of a law, for reports and plans (`{ law, ...params }`). */
export function lawSpec(law: FlowLaw): LawSpec {
  return { law: law.law, ...law.params } as LawSpec;
}
