// Prints the plain closing line "N passed, N failed" after jest's own summary,
// so that any reader of the CI log sees the count in one line.
class SummaryReporter {
  onRunComplete(_contexts, results) {
    process.stdout.write(`\n${results.numPassedTests} passed, ${results.numFailedTests} failed\n`);
  }
}
module.exports = SummaryReporter;
