/**
 * The next step for a site, by what makes it singular: an idealised support, a concentrated load, a
 * crack, a sharp corner. The study writes it into every site's `advice` (study.json), and the
 * terminal and HTML report show the same words.
 */
import type { SiteResult } from './types.js';

/** A site where a support ends: a support-edge site, or a corner with a supported face. */
export function atSupportEnd(site: Pick<SiteResult, 'feature'>): boolean {
  const f = site.feature;
  return f.kind === 'support-edge' || (f.kind === 'corner' && (f.faceConditions?.some((c) => c !== 'free') ?? false));
}

/** A corner whose material angle is that of a crack (a slit closing to a sharp tip). */
export function isCrackLike(site: Pick<SiteResult, 'feature'>): boolean {
  return site.feature.kind === 'corner' && site.feature.interiorAngleDeg >= 350 && !atSupportEnd(site);
}

/** The advice of a site: for a singular site it depends on the cause; otherwise the verdict's own advice. */
export function siteAdvice(site: Pick<SiteResult, 'feature' | 'verdict' | 'advice'>): string | undefined {
  if (site.verdict !== 'singular') return site.advice;
  const f = site.feature;
  if (atSupportEnd(site)) {
    return 'model the real support (the bolts, the contact, the stiffness of the flange or member it is fixed to) rather than a radius: ' +
      'the singularity comes from a support idealised as rigid up to a sharp end, and its readouts describe that idealisation, ' +
      'not the real detail; use them only to compare variants with the same support';
  }
  if (f.kind === 'point-load') return 'spread the force over its real contact length (a pressure on an edge) or read the stress at a distance from it';
  if (f.kind === 'point-support') return 'model the support over its real length and stiffness, or read the stress at a distance from it';
  if (isCrackLike(site)) {
    return 'this is a crack: it needs a fracture assessment (K_I against the material\u2019s fracture toughness, and crack growth under repeated load, by the applicable code or procedure); the peak stress means nothing here';
  }
  return 'do not read the peak as a stress: model the real corner radius, or use the readouts the applicable code asks for';
}

/** The site with its cause-dependent advice in `advice`. */
export function withCauseAdvice<S extends SiteResult>(site: S): S {
  const advice = siteAdvice(site);
  const { advice: _old, ...rest } = site;
  return (advice === undefined ? rest : { ...rest, advice }) as S;
}
