/**
 * The add-in build: the functions bundle (dist/functions.js) with its
 * metadata (dist/functions.json, generated from the functions' doc comments
 * by custom-functions-metadata-plugin, never written by hand), the task pane
 * page that hosts the shared runtime (dist/taskpane.html), office.js served
 * from our own origin, the manifest and the icons.
 */
const path = require('path');
const CopyWebpackPlugin = require('copy-webpack-plugin');
const CustomFunctionsMetadataPlugin = require('custom-functions-metadata-plugin');
const { EsbuildPlugin } = require('esbuild-loader');

/** The files that declare worksheet functions (one function a file). */
const FUNCTION_FILES = [
  'jump',
  'takeup',
  'effect',
  'bandwidth',
  'complierCdf',
  'complierDensity',
  'validity',
  'densityTest',
  'balance',
  'bins',
].map((f) => `./src/functions/${f}.ts`);

/** office.js files of hosts other than Excel, left out of dist/office. */
const OTHER_HOSTS = ['access', 'outlook', 'word', 'powerpoint', 'onenote', 'project', 'visio'];

module.exports = (_env, argv) => ({
  mode: argv.mode || 'production',
  devtool: argv.mode === 'development' ? 'source-map' : false,
  target: ['web', 'es2020'],
  entry: {
    functions: './src/functions/functions.ts',
    taskpane: './src/taskpane/taskpane.ts',
  },
  output: {
    path: path.resolve(__dirname, 'dist'),
    filename: '[name].js',
    clean: { keep: /cutline\.cjs$/ },
  },
  resolve: { extensions: ['.ts', '.js'] },
  module: {
    rules: [{ test: /\.ts$/, loader: 'esbuild-loader', options: { target: 'es2020' } }],
  },
  // esbuild minifies in a fraction of terser's time (the test run builds once).
  optimization: { minimizer: [new EsbuildPlugin({ target: 'es2020' })] },
  performance: { hints: false },
  plugins: [
    new CustomFunctionsMetadataPlugin({ output: 'functions.json', input: FUNCTION_FILES }),
    new CopyWebpackPlugin({
      patterns: [
        { from: 'src/taskpane/taskpane.html', to: 'taskpane.html' },
        { from: 'src/taskpane/taskpane.css', to: 'taskpane.css' },
        { from: 'assets/*.png', to: 'assets/[name][ext]' },
        { from: 'manifest.xml', to: 'manifest.xml' },
        // office.js loads its host scripts and locale strings from beside itself: Excel's, not debug builds.
        {
          from: 'node_modules/@microsoft/office-js/dist',
          to: 'office',
          globOptions: { ignore: ['**/*.debug.js', ...OTHER_HOSTS.map((h) => `**/${h}*`)] },
        },
        { from: 'node_modules/office-ui-fabric-core/dist/css/fabric.min.css', to: 'fabric.min.css' },
      ],
    }),
  ],
});
