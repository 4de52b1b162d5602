// Replaced by the database setup once the foundation lands; pure tests need nothing.
export default async function setup(): Promise<void> {}
