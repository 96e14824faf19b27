// SHA-256 of the report's input-file fingerprint, against published test vectors.
#include <doctest/doctest.h>

#include <string>

#include "core/sha256.h"

using edgeflux::sha256_hex;

TEST_CASE("SHA-256 matches the published test vectors") {
  // FIPS 180-2, Appendix B.1: the one-block message "abc".
  CHECK(sha256_hex("abc") == "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
  // The empty message (NIST CAVP SHA256ShortMsg.rsp, Len = 0; from memory).
  CHECK(sha256_hex("") == "e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855");
  // FIPS 180-2, Appendix B.2: a 448-bit message, whose padding needs a second block.
  CHECK(sha256_hex("abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq") ==
        "248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1");
  // FIPS 180-2, Appendix B.3: one million times "a" (many full blocks).
  CHECK(sha256_hex(std::string(1000000, 'a')) == "cdc76e5c9914fb9281a1c7e284d73e67f1809a48a497200e046d39ccc7112cd0");
}

TEST_CASE("SHA-256 pads correctly at every length around the block boundary") {
  // Lengths 55, 56 and 64 bytes change how many padding blocks follow; the digests of
  // "a" repeated n times are checked against GNU coreutils sha256sum (common practice).
  CHECK(sha256_hex(std::string(55, 'a')) == "9f4390f8d30c2dd92ec9f095b65e2b9ae9b0a925a5258e241c9f1e910f734318");
  CHECK(sha256_hex(std::string(56, 'a')) == "b35439a4ac6f0948b6d6f9e3c6af0f5f590ce20f1bde7090ef7970686ec6738a");
  CHECK(sha256_hex(std::string(64, 'a')) == "ffe054fe7ae0cb6dc65c3af9b61d5209f439851db43d0ba5997337df154668eb");
}
