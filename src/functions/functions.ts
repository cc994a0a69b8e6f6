/**
 * The functions bundle's entry: each module registers its worksheet function
 * with the runtime (the build appends `CustomFunctions.associate(ID, fn)` to
 * each file, from its doc comment; see webpack.config.js).
 */
import './jump';
import './takeup';
import './effect';
import './bandwidth';
import './complierCdf';
import './complierDensity';
import './validity';
import './densityTest';
import './balance';
import './bins';
