import "fake-indexeddb/auto";

process.env.AUTH_SECRET ??= "test-secret-not-for-production-0123456789";
process.env.LODEBOOK_LOG ??= "silent";
