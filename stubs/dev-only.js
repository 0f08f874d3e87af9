// What Ink's development-only imports (its devtools, react-devtools-core) resolve to in the build:
// they run only with DEV=true, and the package ships none of their code.
export default { initialize() {}, connectToDevTools() {} };
