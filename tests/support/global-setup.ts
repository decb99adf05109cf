// Replaced by the database-aware global setup once the foundation lands.
export default async function setup() {}
