import { BaseSequencer, type TestSpecification } from 'vitest/node';

/**
 * Vitest's order (each group by project name, then the slowest or largest file first), with the files
 * that mostly WAIT moved within their group so they overlap with files that compute: the journey (its
 * own `npm start`) and the killed-render-worker test (a lease running out) start first; the scratch
 * PostgreSQL outage test goes last, beside the group's final browser file instead of after it.
 */
const FIRST = [/\/test\/journeys\//, /\/test\/system\/worker-kill\.system\.spec\.ts$/];
const LAST = [/\/test\/system\/database-outage\.system\.spec\.ts$/];

export default class WaitFirstSequencer extends BaseSequencer {
  override async sort(files: TestSpecification[]): Promise<TestSpecification[]> {
    const sorted = await super.sort(files);
    const rank = (spec: TestSpecification) => (FIRST.some((re) => re.test(spec.moduleId)) ? 0 : LAST.some((re) => re.test(spec.moduleId)) ? 2 : 1);
    const group = (spec: TestSpecification) => spec.project.config.sequence.groupOrder;
    // A stable sort: groups keep their order, and so do files of the same rank within a group.
    return sorted
      .map((spec, index) => ({ spec, index }))
      .sort((a, b) => group(a.spec) - group(b.spec) || rank(a.spec) - rank(b.spec) || a.index - b.index)
      .map(({ spec }) => spec);
  }
}
