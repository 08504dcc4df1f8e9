// The compute worker's entry when Furlong runs from its TypeScript sources (development, tests):
// registers tsx's require hook in this thread, then loads the tasks. A compiled build loads
// tasks.js directly.
require('tsx/cjs');
module.exports = require('./tasks.ts');
