import { defineBoot } from "#q-app/wrappers";
export default defineBoot(() => {});
