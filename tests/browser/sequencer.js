// The order of the browser test files. The fields map is read first: it shows the demo farm at its
// default zoom, and later files add their own fields to that farm far from it (a phone job's field
// 150 km away), after which every demo field is drawn a pixel wide. The rest keep Jest's order.
const Sequencer = require('@jest/test-sequencer').default;

const FIRST = ['fields.test.ts'];

class BrowserSequencer extends Sequencer {
  async sort(tests) {
    const rank = (t) => {
      const i = FIRST.findIndex((name) => t.path.endsWith(`/${name}`));
      return i === -1 ? FIRST.length : i;
    };
    return [...(await super.sort(tests))].sort((a, b) => rank(a) - rank(b));
  }
}

module.exports = BrowserSequencer;
