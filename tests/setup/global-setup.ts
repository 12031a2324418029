// Replaced by the walking skeleton: prepares the template database when a test cluster is running.
export default async function setup() {}
