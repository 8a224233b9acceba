/**
 * Every study gridgauge offers, in the order the command line lists them and the page shows
 * their tabs. A new study is one file with its definition (definition.ts) and one line here.
 */
import { absorberStudy } from './absorber-study.ts';
import { convergenceStudy } from './convergence-study.ts';
import type { AnyStudyDefinition } from './definition.ts';
import { resolutionStudy } from './resolution-study.ts';
import { staircaseStudy } from './staircase-study.ts';

export const STUDIES: readonly AnyStudyDefinition[] = [
  absorberStudy,
  resolutionStudy,
  convergenceStudy,
  staircaseStudy,
];

/** The study with this id or command-line verb. */
export function studyNamed(name: string): AnyStudyDefinition | undefined {
  return STUDIES.find((s) => s.id === name || s.verb === name);
}
